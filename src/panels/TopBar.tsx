// Top bar: the drawing's name, a Drawing menu (new, open, save, examples), undo / redo, the two
// tools and fit-to-view. Labels and shortcuts come from the command registry.
import { useEffect, useRef, useState } from 'react';
import { COMMANDS_BY_ID, shortcutLabel } from '../editor/commands';
import { isMacPlatform } from './HelpOverlay';

export interface ExampleEntry {
  id: string;
  title: string;
}

interface Props {
  title: string;
  dirty: boolean;
  tool: 'select' | 'wire' | 'place';
  canUndo: boolean;
  canRedo: boolean;
  undoLabel?: string;
  redoLabel?: string;
  examples: ExampleEntry[];
  onCommand: (id: string) => void;
  onNew: () => void;
  onExample: (id: string) => void;
  showIssues: boolean;
  onToggleIssues: () => void;
  /** Exports (src/export/browserExport.ts exportActions); items are shown when given. */
  onExportSvg?: () => void;
  onExportReport?: () => void;
  onExportPlots?: () => void;
  /** Show the Tidy button (the editor implements the tidy action). */
  canTidy?: boolean;
}

function keyOf(id: string): string | undefined {
  const s = COMMANDS_BY_ID.get(id)?.shortcuts[0];
  return s ? shortcutLabel(s, isMacPlatform()) : undefined;
}

function tip(id: string, extra?: string): string {
  const c = COMMANDS_BY_ID.get(id);
  const k = keyOf(id);
  return `${c?.label ?? id}${extra ? `: ${extra}` : ''}${k ? ` (${k})` : ''}`;
}

export function TopBar(props: Props) {
  const { title, dirty, tool, canUndo, canRedo, examples, onCommand } = props;
  const [open, setOpen] = useState(false);
  const menu = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!open) return;
    const close = (e: PointerEvent) => { if (!menu.current?.contains(e.target as Node)) setOpen(false); };
    window.addEventListener('pointerdown', close);
    return () => window.removeEventListener('pointerdown', close);
  }, [open]);
  const item = (label: string, run: () => void, hint?: string) => (
    <li key={label}>
      <button type="button" role="menuitem" onClick={() => { setOpen(false); run(); }}>
        <span>{label}</span>{hint ? <span className="hint">{hint}</span> : null}
      </button>
    </li>
  );
  return (
    <header className="topbar">
      <div className="brand"><span className="brand-mark" aria-hidden="true" />Polesketch</div>
      <div className="menu" ref={menu}>
        <button type="button" className={`tb-btn${open ? ' on' : ''}`} aria-haspopup="menu" aria-expanded={open} onClick={() => setOpen((o) => !o)}>
          Drawing ▾
        </button>
        {open && (
          <ul className="menu-list" role="menu" onKeyDown={(e) => { if (e.key === 'Escape') setOpen(false); }}>
            {item('New empty drawing', props.onNew)}
            {item('Open drawing…', () => onCommand('file.open'), keyOf('file.open'))}
            {item('Save drawing…', () => onCommand('file.save'), keyOf('file.save'))}
            {props.onExportSvg && item('Export SVG (annotated schematic)', props.onExportSvg)}
            {props.onExportReport && item('Export report (JSON + CSV)', props.onExportReport)}
            {props.onExportPlots && item('Export plots (SVG)', props.onExportPlots)}
            <li className="menu-sep" role="separator" />
            <li className="menu-head">Examples</li>
            {examples.length === 0 && <li className="menu-head faint">none available</li>}
            {examples.map((ex) => item(ex.title, () => props.onExample(ex.id)))}
          </ul>
        )}
      </div>
      <div className="doc-title" title={title}>{title}{dirty ? <span className="dirty" title="Changed since last save">●</span> : null}</div>
      <div className="tb-group">
        <button type="button" className="tb-btn" disabled={!canUndo} title={tip('edit.undo', props.undoLabel)} onClick={() => onCommand('edit.undo')}>Undo</button>
        <button type="button" className="tb-btn" disabled={!canRedo} title={tip('edit.redo', props.redoLabel)} onClick={() => onCommand('edit.redo')}>Redo</button>
      </div>
      <div className="tb-group" role="group" aria-label="Tool">
        <button type="button" className={`tb-btn${tool === 'select' ? ' on' : ''}`} aria-pressed={tool === 'select'} title={tip('tool.select')} onClick={() => onCommand('tool.select')}>Select</button>
        <button type="button" className={`tb-btn${tool === 'wire' ? ' on' : ''}`} aria-pressed={tool === 'wire'} title={tip('tool.wire')} onClick={() => onCommand('tool.wire')}>Wire</button>
      </div>
      <div className="tb-group">
        <button type="button" className="tb-btn" title={tip('edit.turn')} onClick={() => onCommand('edit.turn')}>Turn</button>
        <button type="button" className="tb-btn" title={tip('edit.flip')} onClick={() => onCommand('edit.flip')}>Flip</button>
        <button type="button" className="tb-btn" title={tip('view.fit')} onClick={() => onCommand('view.fit')}>Fit</button>
        {props.canTidy && <button type="button" className="tb-btn" title={tip('layout.tidy')} onClick={() => onCommand('layout.tidy')}>Tidy</button>}
        <button type="button" className={`tb-btn${props.showIssues ? ' on' : ''}`} aria-pressed={props.showIssues} title="Show drawing problems on the drawing" onClick={props.onToggleIssues}>Checks</button>
      </div>
      <div className="tb-group">
        <button type="button" className="tb-btn" title={tip('help.toggle')} aria-label="Keyboard shortcuts" onClick={() => onCommand('help.toggle')}>?</button>
      </div>
    </header>
  );
}
