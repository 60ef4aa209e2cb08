// A text field checked as it is typed. A valid text is applied on Enter or when the field loses
// focus; a bad text stays in the field, marked and explained, and is not applied. Escape goes
// back to the applied value.
import { useId, useState } from 'react';

export type FieldCheck = { ok: true; note?: string } | { ok: false; reason: string };

interface Props {
  label: string;
  /** The applied text (from the document). */
  value: string;
  /** Unit shown after the label, e.g. "Ω". */
  unit?: string;
  check: (text: string) => FieldCheck;
  onApply: (text: string) => void;
  /** A text typed but not applied (kept across re-renders by the owner), or null. */
  draft?: string | null;
  onDraft?: (text: string | null) => void;
  /** Plain-text look (names) instead of numbers. */
  plain?: boolean;
  hint?: string;
}

export function CheckedField({ label, value, unit, check, onApply, draft, onDraft, plain, hint }: Props) {
  const id = useId();
  const [localDraft, setLocalDraft] = useState<string | null>(null);
  const current = draft !== undefined ? draft : localDraft;
  const setDraft = (t: string | null) => (onDraft ? onDraft(t) : setLocalDraft(t));
  const text = current ?? value;
  const result = check(text);
  const dirty = current !== null && current !== value;
  const apply = () => {
    if (!dirty) { setDraft(null); return; }
    if (result.ok) {
      onApply(text);
      setDraft(null);
    }
  };
  const msgId = `${id}-msg`;
  return (
    <div className="field">
      <label htmlFor={id}>
        {label}
        {unit ? <span className="unit"> ({unit})</span> : null}
      </label>
      <input
        id={id}
        type="text"
        spellCheck={false}
        autoComplete="off"
        value={text}
        aria-invalid={!result.ok}
        aria-describedby={msgId}
        style={plain ? { fontFamily: 'inherit' } : undefined}
        onChange={(e) => setDraft(e.target.value)}
        onBlur={apply}
        onKeyDown={(e) => {
          if (e.key === 'Enter') { e.preventDefault(); apply(); }
          else if (e.key === 'Escape') { e.preventDefault(); setDraft(null); }
          e.stopPropagation();
        }}
      />
      {!result.ok ? (
        <div className="msg" id={msgId} role="alert">
          {result.reason}{dirty ? ' — not applied.' : ''}
        </div>
      ) : (
        <div className="note" id={msgId}>
          {dirty ? 'Enter to apply' : result.note ?? hint ?? ''}
        </div>
      )}
    </div>
  );
}
