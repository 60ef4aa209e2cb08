// Inspector for the selection: reference designator, orientation, bulk and parameter set of a
// transistor, the input flag of a source, and every value field checked as typed (SI prefixes and
// units). Edits go through the editor, one undo entry each.
import { formatSi } from '../engine/units';
import type { Editor } from '../editor/types';
import type { BulkTie, ItemId, ParamMode, PartId, PartRecord } from '../schematic/document';
import { isPartId, isWireId } from '../schematic/document';
import { activeParams, checkParam, checkRef, MOS_KINDS } from '../schematic/kinds';
import { symbolOf, type SymbolParam } from '../schematic/symbols';
import { CheckedField, type FieldCheck } from './CheckedField';

export type Drafts = Record<string, string | null>;

interface Props {
  editor: Editor;
  selection: ReadonlySet<ItemId>;
  drafts: Drafts;
  setDraft: (key: string, text: string | null) => void;
}

function paramCheck(spec: SymbolParam): (text: string) => FieldCheck {
  return (text) => {
    const r = checkParam(spec, text);
    if (!r.ok) return { ok: false, reason: r.reason };
    if (typeof r.value === 'number' && spec.unit !== '' && !spec.unit.includes('/')) return { ok: true, note: `= ${formatSi(r.value, spec.unit)}` };
    if (typeof r.value === 'number') return { ok: true, note: `= ${formatSi(r.value, spec.unit)}` };
    return { ok: true, note: spec.required ? undefined : r.value === undefined ? 'optional' : undefined };
  };
}

const MODE_LABEL: Record<ParamMode, string> = { bias: 'Bias point', direct: 'Small-signal' };
const BULK_LABEL: Record<BulkTie, string> = { source: 'to source', rail: 'to its rail', pin: 'own pin, wired' };

function PartInspector({ editor, part, drafts, setDraft }: { editor: Editor; part: PartRecord; drafts: Drafts; setDraft: Props['setDraft'] }) {
  const sym = symbolOf(part.kind);
  const hasModes = sym.params.some((p) => p.mode);
  const mode: ParamMode = part.mode ?? 'bias';
  const fields = hasModes ? activeParams(part) : sym.params;
  const groups = new Map<string, string[]>();
  for (const f of fields) if (f.oneOf) groups.set(f.oneOf, [...(groups.get(f.oneOf) ?? []), f.label]);
  const refKey = `${part.id}/#ref`;
  return (
    <div data-testid="part-inspector">
      <div className="part-head">
        <strong>{part.ref}</strong>
        <span className="part-kind">{sym.title}</span>
      </div>
      <CheckedField
        label="Name" plain value={part.ref}
        check={(t) => { const r = checkRef(editor.document, part.id, t); return r.ok ? { ok: true } : { ok: false, reason: r.reason }; }}
        onApply={(t) => { editor.setRef(part.id, t.trim()); }}
        draft={drafts[refKey] ?? null} onDraft={(t) => setDraft(refKey, t)}
      />
      <div className="field">
        <label>Orientation</label>
        <div className="orient">
          <button type="button" className="tb-btn" title="Turn 90° counter-clockwise" onClick={() => editor.updatePart(part.id, { rotation: ((part.rotation + 270) % 360) as PartRecord['rotation'] })}>⟲</button>
          <span className="orient-value">{part.rotation}°</span>
          <button type="button" className="tb-btn" title="Turn 90° clockwise" onClick={() => editor.updatePart(part.id, { rotation: ((part.rotation + 90) % 360) as PartRecord['rotation'] })}>⟳</button>
          <label className="checkline">
            <input type="checkbox" checked={part.mirror} onChange={(e) => editor.updatePart(part.id, { mirror: e.target.checked })} />
            mirrored
          </label>
        </div>
      </div>
      {MOS_KINDS.has(part.kind) && (
        <div className="field">
          <label htmlFor={`${part.id}-bulk`}>Bulk</label>
          <select id={`${part.id}-bulk`} value={part.bulk ?? 'source'} onChange={(e) => editor.updatePart(part.id, { bulk: e.target.value as BulkTie })}>
            {(Object.keys(BULK_LABEL) as BulkTie[]).map((b) => <option key={b} value={b}>{BULK_LABEL[b]}</option>)}
          </select>
          <div className="note">{part.bulk === 'pin' ? 'Wire the b pin; gmb and Csb act on its net.' : part.bulk === 'rail' ? 'The rail is AC ground in the small-signal model.' : 'No body effect: vbs = 0.'}</div>
        </div>
      )}
      {(part.kind === 'vsource' || part.kind === 'isource') && (
        <label className="checkline">
          <input type="checkbox" checked={!!part.isInput} onChange={(e) => editor.updatePart(part.id, { isInput: e.target.checked })} />
          drives the analysis (input)
        </label>
      )}
      <label className="checkline" title="Tidy layout moves the other parts around this one">
        <input type="checkbox" checked={!!part.pinned} onChange={(e) => editor.updatePart(part.id, { pinned: e.target.checked || undefined })} />
        keep in place when tidying
      </label>
      {hasModes && (
        <div className="seg" role="group" aria-label="Parameter set">
          {(['bias', 'direct'] as ParamMode[]).map((m) => (
            <button key={m} type="button" aria-pressed={mode === m} onClick={() => editor.updatePart(part.id, { mode: m })}>{MODE_LABEL[m]}</button>
          ))}
        </div>
      )}
      {fields.map((spec) => {
        const key = `${part.id}/${spec.name}`;
        return (
          <CheckedField
            key={key} label={spec.label} unit={spec.unit || undefined} plain={spec.text}
            value={part.params[spec.name] ?? ''} check={paramCheck(spec)}
            onApply={(t) => editor.setParam(part.id, spec.name, t.trim())}
            draft={drafts[key] ?? null} onDraft={(t) => setDraft(key, t)}
          />
        );
      })}
      {[...groups.values()].map((labels) => (
        <p key={labels.join()} className="empty-note">Give one of {labels.join(' or ')}; leave the other empty.</p>
      ))}
      {hasModes && mode === 'bias' && (
        <p className="empty-note">Small-signal values are derived from the bias point with the drawing's process card (square-law estimate).</p>
      )}
    </div>
  );
}

export function PropertyPanel({ editor, selection, drafts, setDraft }: Props) {
  const ids = [...selection];
  const parts = ids.filter(isPartId).map((id) => editor.document.parts[id as PartId]).filter(Boolean);
  const wires = ids.filter(isWireId).length;
  if (ids.length === 0) {
    return <p className="empty-note">Nothing selected. Click a part to edit its values, or pick one from the shelf on the left to place it.</p>;
  }
  if (parts.length === 1 && ids.length === 1) {
    return <PartInspector editor={editor} part={parts[0]} drafts={drafts} setDraft={setDraft} />;
  }
  return (
    <p className="empty-note">
      {parts.length} part{parts.length === 1 ? '' : 's'} and {wires} wire{wires === 1 ? '' : 's'} selected. Turn, flip, duplicate or delete them together; select a single part to edit its values.
    </p>
  );
}
