// Parts shelf: every symbol drawn by the one symbol view, grouped by use. Click arms the place
// tool (the part then follows the pointer); dragging onto the sheet places one part where it drops.
import { memo } from 'react';
import { Layer, Stage } from 'react-konva';
import { COMMANDS_BY_ID } from '../editor/commands';
import type { SymbolKind } from '../schematic/document';
import { symbolOf } from '../schematic/symbols';
import { SymbolView } from '../canvas/SymbolView';
import { PART_DRAG_TYPE } from '../canvas/Sheet';
import { INK, SELECTED } from '../canvas/theme';

export const SHELF_GROUPS: { title: string; kinds: SymbolKind[] }[] = [
  { title: 'Passive', kinds: ['resistor', 'capacitor', 'inductor'] },
  { title: 'Transistors', kinds: ['nmos', 'pmos', 'npn', 'pnp'] },
  { title: 'Sources and gain', kinds: ['vsource', 'isource', 'vccs', 'vcvs', 'amplifier'] },
  { title: 'Nets and markers', kinds: ['ground', 'supply', 'netLabel', 'input', 'output'] },
];

const SHORT_NAME: Partial<Record<SymbolKind, string>> = {
  vccs: 'VCCS', vcvs: 'VCVS', amplifier: 'Diff. amp', netLabel: 'Net label', supply: 'Supply rail',
  input: 'Input', output: 'Output', vsource: 'V source', isource: 'I source',
  nmos: 'nMOS', pmos: 'pMOS', npn: 'npn', pnp: 'pnp',
};

const THUMB_W = 64;
const THUMB_H = 44;

const Thumb = memo(function Thumb({ kind, armed }: { kind: SymbolKind; armed: boolean }) {
  const sym = symbolOf(kind);
  // Fit the symbol's pins and body into the thumbnail.
  let x0 = sym.bounds.x, y0 = sym.bounds.y, x1 = sym.bounds.x + sym.bounds.width, y1 = sym.bounds.y + sym.bounds.height;
  for (const p of sym.pins) {
    if (p.optional) continue;
    x0 = Math.min(x0, p.x); y0 = Math.min(y0, p.y); x1 = Math.max(x1, p.x); y1 = Math.max(y1, p.y);
  }
  const s = Math.min((THUMB_W - 8) / Math.max(1, x1 - x0), (THUMB_H - 8) / Math.max(1, y1 - y0), 1.2);
  const ox = THUMB_W / 2 - ((x0 + x1) / 2) * s;
  const oy = THUMB_H / 2 - ((y0 + y1) / 2) * s;
  return (
    <Stage width={THUMB_W} height={THUMB_H} listening={false} className="thumb">
      <Layer listening={false} x={ox} y={oy} scaleX={s} scaleY={s}>
        <SymbolView symbol={sym} x={0} y={0} rotation={0} mirror={false} color={armed ? SELECTED : INK} strokeWidth={1.4 / s} />
      </Layer>
    </Stage>
  );
});

interface Props {
  armed: SymbolKind | null;
  onArm: (kind: SymbolKind) => void;
  onDragStart: (kind: SymbolKind) => void;
  onDragEnd: () => void;
}

export function Palette({ armed, onArm, onDragStart, onDragEnd }: Props) {
  return (
    <nav className="shelf" aria-label="Parts">
      {SHELF_GROUPS.map((g) => (
        <section key={g.title}>
          <h2>{g.title}</h2>
          <div className="shelf-grid">
            {g.kinds.map((kind) => {
              const sym = symbolOf(kind);
              const key = COMMANDS_BY_ID.get(`place.${kind}`)?.shortcuts[0];
              return (
                <button
                  key={kind} type="button" draggable
                  className={`shelf-item${armed === kind ? ' armed' : ''}`}
                  title={`${sym.title}${key ? ` (key ${key})` : ''}: click, then click on the drawing; or drag it there`}
                  aria-label={`Place ${sym.title}`} aria-pressed={armed === kind}
                  onClick={() => onArm(kind)}
                  onDragStart={(e) => {
                    e.dataTransfer.setData(PART_DRAG_TYPE, kind);
                    e.dataTransfer.effectAllowed = 'copy';
                    onDragStart(kind);
                  }}
                  onDragEnd={onDragEnd}
                >
                  <Thumb kind={kind} armed={armed === kind} />
                  <span className="name">{SHORT_NAME[kind] ?? sym.title}{key ? <kbd className="shelf-key">{key}</kbd> : null}</span>
                </button>
              );
            })}
          </div>
        </section>
      ))}
    </nav>
  );
}
