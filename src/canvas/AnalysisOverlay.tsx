// HTML part of the live analysis overlay, laid over the drawing surface: the per-net badges (at
// the boxes annotate() placed clear of the symbols), the slowest node's tag, the hover read-out
// of a wire, and — when the drawing or the engine reports an error — the messages at the place
// of each fault instead of the analysis marks. Pointer input passes through to the sheet.
import { memo, useMemo } from 'react';
import type { SchematicAnnotations } from '../export/annotations';
import type { LiveState } from '../live/types';
import { worldToScreen, type Camera, type Point } from './camera';
import { badgesOnScreen, wireReadout } from './overlayModel';
import './analysis-overlay.css';

interface Props {
  state: LiveState;
  ann: SchematicAnnotations | null;
  camera: Camera;
  /** Nets lit by a hovered pole (their badges are emphasised). */
  lit: ReadonlySet<string>;
  /** World position of the pointer (for the read-out), null when off the sheet. */
  pointer: Point | null;
  /** Net under the pointer on the canvas (its full read-out is shown). */
  pointerNet: string | null;
}

const MAX_CALLOUTS = 8;

function AnalysisOverlayView({ state, ann, camera, lit, pointer, pointerNet }: Props) {
  const placed = ann?.badges ?? [];
  const badges = useMemo(() => badgesOnScreen(placed, camera), [placed, camera]);
  if (!state.result || !state.result.ok) return <FaultCallouts state={state} camera={camera} />;
  if (!ann) return null;
  const slowest = ann.slowest;
  const selected = state.settings.selectedNet;
  return (
    <div className="ao-root" data-testid="analysis-overlay" aria-label="Analysis marks (linear small-signal estimates)"
      data-camera={`${camera.scale},${camera.x},${camera.y}`} data-runner={state.runner}>
      <svg className="ao-leaders" aria-hidden="true">
        {badges.map((b, i) => placed[i].leader && !b.collapsed && (
          <line key={b.net} x1={b.anchor.x} y1={b.anchor.y} x2={clamp(b.anchor.x, b.left, b.left + b.width)} y2={clamp(b.anchor.y, b.top, b.top + b.height)} />
        ))}
      </svg>
      {badges.map((b) => {
        const marks = [lit.has(b.net) ? 'lit' : '', slowest?.net === b.net ? 'slowest' : '', selected === b.net ? 'selected' : ''].filter(Boolean).join(' ');
        const cls = `ao-badge ${marks}`.trim();
        if (b.collapsed) {
          return <span key={b.net} className={`ao-dot ${marks}`.trim()} data-net={b.net} title={b.lines.join(' · ')} style={{ left: b.anchor.x - 3, top: b.anchor.y - 3, background: ann.nets[b.net]?.color }} />;
        }
        return (
          <div key={b.net} className={cls} data-testid={`badge-${b.net}`} data-net={b.net}
            style={{ left: b.left, top: b.top, minWidth: b.width, minHeight: b.height, fontSize: b.fontPx, borderColor: ann.nets[b.net]?.color }}>
            {slowest?.net === b.net && <div className="ao-slowest-tag">▲ slowest node</div>}
            {b.lines.map((l, i) => <div key={i} className={i === 0 ? 'ao-line ao-head' : 'ao-line'}>{l}</div>)}
          </div>
        );
      })}
      {slowest && <SlowestLabel text={slowest.label} at={worldToScreen(camera, slowest.anchor)} collapsed={badges.find((b) => b.net === slowest.net)?.collapsed ?? true} />}
      {pointerNet && <WireReadout state={state} net={pointerNet} at={pointer ? worldToScreen(camera, pointer) : null} />}
    </div>
  );
}

const clamp = (v: number, lo: number, hi: number) => Math.min(hi, Math.max(lo, v));

/** When the slowest badge is collapsed (zoomed out) its mark still says what it is. */
function SlowestLabel({ text, at, collapsed }: { text: string; at: Point; collapsed: boolean }) {
  if (!collapsed) return null;
  return <div className="ao-slowest-float" style={{ left: at.x + 12, top: at.y + 8 }}>▲ {text}</div>;
}

function WireReadout({ state, net, at }: { state: LiveState; net: string; at: Point | null }) {
  const loop = state.settings.selectedLoopId ? state.loops[state.settings.selectedLoopId] : undefined;
  const rows = wireReadout(state.result!, net, loop ? state.blackman[loop.key] ?? null : null, loop?.label ?? null, state.settings.frequencyHz);
  const pos = at ?? { x: 12, y: 12 };
  return (
    <div className="ao-readout" role="tooltip" data-testid="wire-readout" style={{ left: pos.x + 16, top: pos.y + 16 }}>
      <div className="ao-readout-title">net {net}</div>
      <table>
        <tbody>
          {rows.map((r) => <tr key={r.label}><th>{r.label}</th><td>{r.value}</td></tr>)}
        </tbody>
      </table>
      <div className="ao-readout-note">linear small-signal estimate</div>
    </div>
  );
}

/** Errors replace the analysis marks: each message at its fault (whole-drawing ones in a list). */
function FaultCallouts({ state, camera }: { state: LiveState; camera: Camera }) {
  const errors = state.issues.filter((i) => i.severity === 'error');
  if (state.status !== 'error' || (errors.length === 0 && !state.failure)) return null;
  const placed = errors.filter((i) => i.x !== null && i.y !== null).slice(0, MAX_CALLOUTS);
  const loose = errors.filter((i) => i.x === null || i.y === null);
  const seen = new Map<string, number>();
  return (
    <div className="ao-root" data-testid="analysis-faults">
      <div className="ao-fault-head" aria-live="polite">
        Analysis paused — {errors.length} problem{errors.length === 1 ? '' : 's'} to fix{placed.length < errors.length - loose.length ? ` (first ${placed.length} marked)` : ''}
        {state.failure ? `; ${state.failure}` : ''}
        {loose.map((i) => <div key={i.code + i.message} className="ao-fault-loose">{i.message}</div>)}
      </div>
      {placed.map((i, n) => {
        const p = worldToScreen(camera, { x: i.x!, y: i.y! });
        const key = `${i.x},${i.y}`;
        const stack = seen.get(key) ?? 0;
        seen.set(key, stack + 1);
        return (
          <div key={`${i.code}:${n}`} className="ao-fault" role="note" style={{ left: p.x + 14, top: p.y + 16 + stack * 34 }}>
            {i.message}
          </div>
        );
      })}
    </div>
  );
}

export const AnalysisOverlay = memo(AnalysisOverlayView);
