// The main screen: top bar / parts shelf | drawing | inspector and results / status line.
// React only renders the editor's state and forwards input to it; tools, hit-testing, snapping,
// the camera, undo and the document rules live in src/editor and src/schematic.
import { memo, useCallback, useEffect, useMemo, useRef, useState } from 'react';
import type { Editor, EditorEvent } from './editor/types';
import type { DrawingDocument, PartId, SymbolKind } from './schematic/document';
import { documentToNetlist } from './schematic/toNetlist';
import { Sheet } from './canvas/Sheet';
import { gridBackground } from './canvas/GridLayer';
import { PartsLayer } from './canvas/PartsLayer';
import { OverlayMarks, WHOLE_DRAWING_CODES } from './canvas/OverlayLayer';
import { InteractionMarks } from './canvas/InteractionLayer';
import { Layer } from 'react-konva';
import { Palette } from './panels/Palette';
import { PropertyPanel, type Drafts } from './panels/PropertyPanel';
import { TopBar, type ExampleEntry } from './panels/TopBar';
import { HelpOverlay } from './panels/HelpOverlay';
import { StatusLine } from './panels/StatusLine';
import { IssueList } from './panels/IssueList';
import { ResultsPanel } from './panels/ResultsPanel';
import { useBrowserHost, type Banner } from './panels/browserHost';
import type { LiveStore } from './live/types';
import { AnalysisProvider } from './live/useAnalysis';
import { useLiveSubmit } from './live/useEditorAnalysis';
import { liveView } from './live/liveView';
import { perfMeasure, perfNow } from './live/perfMarks';
import { LiveSheetMarks, LiveWireMarks } from './canvas/LiveOverlay';
import type { ElkRunner } from './layout/elkGraph';
import { exportActions } from './export/browserExport';
import { exportOptionsOf } from './export/liveExport';

export interface AppProps {
  editor: Editor;
  /** Drawings offered in the Drawing menu. */
  examples?: (ExampleEntry & { load: () => DrawingDocument })[];
  /** Browser storage for autosave and the cross-tab clipboard; null turns both off (tests). */
  storage?: Storage | null;
  /** Live analysis store (src/live); by default the app makes its own. */
  analysisStore?: LiveStore;
  /** Layout engine for tidy and netlist import (tests pass the in-process one); default: a web worker. */
  elk?: () => ElkRunner;
}

// The parts shelf draws every symbol: kept from re-rendering on each edit (its callbacks are stable).
const Shelf = memo(Palette);

function isTypingTarget(t: EventTarget | null): boolean {
  const el = t as HTMLElement | null;
  if (!el || !el.tagName) return false;
  return el.tagName === 'INPUT' || el.tagName === 'TEXTAREA' || el.tagName === 'SELECT' || el.isContentEditable;
}

export function App({ editor, examples = [], storage = typeof localStorage === 'undefined' ? null : localStorage, analysisStore, elk }: AppProps) {
  // Re-renders on every editor change. The app does not subscribe to the analysis state: the
  // overlay's components and the results panel do (a new result re-renders those only).
  const store = useLiveSubmit(editor, analysisStore);
  const { state, document: doc, selection, camera, history } = editor;
  const [drafts, setDrafts] = useState<Drafts>({});
  const [showIssues, setShowIssues] = useState(true);
  const [dragKind, setDragKind] = useState<SymbolKind | null>(null);
  const [savedDoc, setSavedDoc] = useState<DrawingDocument | null>(doc);
  const [banner, setBanner] = useState<Banner | null>(null);

  const dispatch = useCallback((ev: EditorEvent) => editor.dispatch(ev), [editor]);
  const host = useBrowserHost({ editor, storage, examples, setBanner, onSaved: setSavedDoc, elk });

  // The drawing checks of this revision; the live store converts the same revision (cached).
  const analysis = useMemo(() => {
    const t0 = perfNow();
    const d = documentToNetlist(doc);
    perfMeasure('netlist', t0);
    return d;
  }, [doc]);

  // Exports read the live state at click time: the SVG is drawn from the overlay's annotations.
  const exports = useMemo(() => exportActions(
    () => editor.document,
    () => exportOptionsOf(store.getState().settings, store.getState().loops),
    () => {
      const s = store.getState();
      const ann = liveView(s).ann;
      return ann && s.result && s.doc === editor.document ? { annotations: ann, result: s.result } : null;
    },
    () => store.getState(),
  ), [editor, store]);
  const errors = analysis.issues.filter((i) => i.severity === 'error').length;
  const warnings = analysis.issues.length - errors;

  // Global shortcuts (not while typing in a field).
  useEffect(() => {
    const onKey = (e: KeyboardEvent) => {
      if (isTypingTarget(e.target)) return;
      if (e.defaultPrevented) return;
      const used = editor.dispatch({ type: 'key', key: e.key, shift: e.shiftKey, ctrl: e.ctrlKey, alt: e.altKey, meta: e.metaKey });
      if (used) e.preventDefault();
    };
    window.addEventListener('keydown', onKey);
    return () => window.removeEventListener('keydown', onKey);
  }, [editor]);

  const setDraft = useCallback((key: string, text: string | null) => {
    setDrafts((d) => {
      if (text === null) {
        if (!(key in d)) return d;
        const { [key]: _gone, ...rest } = d;
        return rest;
      }
      return { ...d, [key]: text };
    });
  }, []);

  const onSize = useCallback((s: { width: number; height: number }) => dispatch({ type: 'viewport', width: s.width, height: s.height }), [dispatch]);

  const dragKindRef = useRef(dragKind);
  dragKindRef.current = dragKind;
  const onArm = useCallback((kind: SymbolKind) => dispatch({ type: 'tool', tool: 'place', kind }), [dispatch]);
  const onShelfDragStart = useCallback((kind: SymbolKind) => { setDragKind(kind); dispatch({ type: 'tool', tool: 'place', kind, once: true }); }, [dispatch]);
  const onShelfDragEnd = useCallback(() => {
    if (dragKindRef.current) { setDragKind(null); if (editor.state.tool === 'place') dispatch({ type: 'cancel' }); }
  }, [dispatch, editor]);

  const armed = state.tool === 'place' && state.ghost ? state.ghost.kind : null;
  const cursorStyle = state.mode === 'pan.dragging' ? 'grabbing' : state.tool === 'wire' || state.tool === 'place' ? 'crosshair' : state.hover.type === 'none' ? 'default' : 'pointer';
  const title = doc.title?.trim() || 'Untitled drawing';

  return (
    <AnalysisProvider store={store}>
    <div className="app">
      <TopBar
        title={title} dirty={savedDoc !== doc} tool={state.tool}
        canUndo={history.canUndo} canRedo={history.canRedo} undoLabel={history.undoLabel} redoLabel={history.redoLabel}
        examples={examples} onCommand={(id) => dispatch({ type: 'command', id })}
        onNew={host.newDrawing} onExample={host.openExample}
        showIssues={showIssues} onToggleIssues={() => setShowIssues((s) => !s)}
        canTidy
        onExportSvg={exports.onExportSvg} onExportReport={exports.onExportReport} onExportPlots={exports.onExportPlots}
      />
      <Shelf armed={dragKind ?? armed} onArm={onArm} onDragStart={onShelfDragStart} onDragEnd={onShelfDragEnd} />
      <Sheet
        camera={camera} onEvent={dispatch} onSize={onSize} cursor={cursorStyle}
        onPartDragOver={(w, s) => dispatch({ type: 'pointerMove', x: w.x, y: w.y, sx: s.x, sy: s.y })}
        onPartDrop={(w, s) => {
          dispatch({ type: 'pointerMove', x: w.x, y: w.y, sx: s.x, sy: s.y });
          dispatch({ type: 'pointerUp', x: w.x, y: w.y, sx: s.x, sy: s.y, button: 0 });
          setDragKind(null);
        }}
        onFileDrop={host.openFileObject}
        backdrop={gridBackground(camera)}
        overlay={
          <>
            {banner && (
              <div className={`banner${banner.kind === 'info' ? ' info' : ''}`} role={banner.kind === 'error' ? 'alert' : 'status'}>
                <span>{banner.text}</span>
                <button type="button" aria-label="Dismiss" onClick={() => setBanner(null)}>×</button>
              </div>
            )}
            {showIssues && (
              <ul className="sheet-notes" aria-label="Problems of the whole drawing">
                {analysis.issues.filter((i) => WHOLE_DRAWING_CODES.has(i.code)).map((i) => (
                  <li key={i.code} className={i.severity}>{i.message}</li>
                ))}
              </ul>
            )}
            <LiveSheetMarks store={store} camera={camera} pointer={state.cursor} hover={state.hover} selection={selection} />
            <div className="sheet-zoom">
              <button type="button" className="tb-btn" title="Zoom out" onClick={() => dispatch({ type: 'command', id: 'view.zoomOut' })}>−</button>
              <span className="zoom-value">{Math.round(camera.scale * 50)}%</span>
              <button type="button" className="tb-btn" title="Zoom in" onClick={() => dispatch({ type: 'command', id: 'view.zoomIn' })}>+</button>
              <button type="button" className="tb-btn" title="Fit drawing to view" onClick={() => dispatch({ type: 'command', id: 'view.fit' })}>Fit</button>
            </div>
          </>
        }
      >
        {() => (
          <>
            <PartsLayer doc={doc} selection={selection} hover={state.hover} wireMarks={<LiveWireMarks store={store} doc={doc} scale={camera.scale} />} />
            {/* one canvas for the junctions, issue marks and the pointer's marks */}
            <Layer listening={false}>
              <OverlayMarks junctions={analysis.junctions} issues={analysis.issues} scale={camera.scale} showIssues={showIssues} />
              <InteractionMarks state={state} scale={camera.scale} />
            </Layer>
          </>
        )}
      </Sheet>
      <aside className="side" aria-label="Inspector">
        <div className="inspector">
          <h2>Properties</h2>
          <PropertyPanel editor={editor} selection={selection} drafts={drafts} setDraft={setDraft} />
          <h2>Drawing checks</h2>
          <IssueList issues={analysis.issues} onPick={(iss) => { if (iss.part) editor.select([iss.part as PartId]); else if (iss.wire) editor.select([iss.wire]); }} />
        </div>
        <ResultsPanel store={store} analysis={analysis} />
      </aside>
      <StatusLine
        mode={state.mode} cursor={state.cursor} selected={selection.size} errors={errors} warnings={warnings}
        notice={state.notice ?? host.flash} noticeIsError={false}
      />
      {state.helpOpen && <HelpOverlay onClose={() => dispatch({ type: 'command', id: 'help.toggle' })} />}
      <input ref={host.fileInput} type="file" accept=".json,application/json" hidden data-testid="file-input" onChange={host.onFilePicked} />
    </div>
    </AnalysisProvider>
  );
}
