// Shortcut list, read from the one command registry (src/editor/commands.ts).
import { useEffect, useRef } from 'react';
import { helpRows, type CommandGroup } from '../editor/commands';

const ORDER: CommandGroup[] = ['Tools', 'Place', 'Edit', 'View', 'File', 'Help'];

export function isMacPlatform(): boolean {
  return typeof navigator !== 'undefined' && /Mac|iPhone|iPad/.test(navigator.platform ?? '');
}

export function HelpOverlay({ onClose }: { onClose: () => void }) {
  const rows = helpRows(isMacPlatform());
  const box = useRef<HTMLDivElement>(null);
  useEffect(() => box.current?.focus(), []);
  return (
    <div className="help-backdrop" onClick={onClose}>
      <div
        className="help" role="dialog" aria-modal="true" aria-label="Keyboard shortcuts" tabIndex={-1} ref={box}
        onClick={(e) => e.stopPropagation()}
        onKeyDown={(e) => { if (e.key === 'Escape' || e.key === '?') { e.preventDefault(); e.stopPropagation(); onClose(); } }}
      >
        <h2>Keyboard shortcuts</h2>
        <div className="help-groups">
          {ORDER.map((g) => {
            const list = rows.filter((r) => r.group === g);
            if (list.length === 0) return null;
            return (
              <table key={g}>
                <caption>{g}</caption>
                <tbody>
                  {list.map((r) => (
                    <tr key={r.label}>
                      <td>{r.label}</td>
                      <td className="keys">{r.keys.map((k, i) => <span key={k}>{i > 0 ? ' ' : ''}<kbd>{k}</kbd></span>)}</td>
                    </tr>
                  ))}
                </tbody>
              </table>
            );
          })}
        </div>
        <p className="help-foot">
          Mouse: wheel zooms about the pointer; drag with the middle button, or with Alt held, to pan.
          Shift-click adds to or removes from the selection; drag on empty space for a selection box.
        </p>
        <button type="button" className="tb-btn" onClick={onClose}>Close</button>
      </div>
    </div>
  );
}
