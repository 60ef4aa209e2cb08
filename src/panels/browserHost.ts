// What the editor needs from the browser: file download and pick, the system clipboard with a
// localStorage copy (so two tabs of the app can copy and paste between each other; the other tab
// learns of it from the storage event), and autosave with restore after a reload.
import { downloadText } from '../export/browserExport';
import { useCallback, useEffect, useRef, useState, type ChangeEvent, type RefObject } from 'react';
import type { Editor } from '../editor/types';
import { emptyDocument, type DrawingDocument } from '../schematic/document';
import { autosave, loadDrawing, restoreAutosave, saveDrawing } from '../schematic/file';

import { CLIP_STORAGE_KEY } from '../editor/clipboard';
import type { ElkRunner } from '../layout/elkGraph';
import { workerElk } from '../layout/elkWorker';
import { importNetlistText } from '../layout/importNetlist';
import { editorTidy } from '../export/browserExport';

export const CLIPBOARD_KEY = CLIP_STORAGE_KEY;
const AUTOSAVE_DELAY_MS = 400;

export interface Banner {
  kind: 'error' | 'info';
  text: string;
}

interface Options {
  editor: Editor;
  storage: Storage | null;
  examples: { id: string; title: string; load: () => DrawingDocument }[];
  setBanner: (b: Banner | null) => void;
  onSaved: (doc: DrawingDocument) => void;
  /** Layout engine for tidy and netlist import; by default ELK in a web worker, made on first use. */
  elk?: () => ElkRunner;
}

/** An engine netlist file (format 'polesketch-netlist') rather than a drawing or a clipboard clip. */
export function isNetlistText(text: string): boolean {
  return /"format"\s*:\s*"polesketch-netlist"/.test(text);
}

export interface BrowserHost {
  fileInput: RefObject<HTMLInputElement | null>;
  onFilePicked: (e: ChangeEvent<HTMLInputElement>) => void;
  openFileObject: (file: File) => void;
  openText: (text: string, name: string) => void;
  newDrawing: () => void;
  openExample: (id: string) => void;
  flash: string | null;
}

export function fileNameFor(doc: DrawingDocument): string {
  const base = (doc.title ?? '').trim().replace(/[^A-Za-z0-9._-]+/g, '-').replace(/^-+|-+$/g, '');
  return `${base || 'drawing'}.json`;
}

/** File text, with FileReader where Blob.text is missing (older engines, jsdom). */
export function readFileText(file: Blob): Promise<string> {
  if (typeof file.text === 'function') return file.text();
  return new Promise((resolve, reject) => {
    const r = new FileReader();
    r.onload = () => resolve(String(r.result ?? ''));
    r.onerror = () => reject(r.error ?? new Error('unreadable file'));
    r.readAsText(file);
  });
}

const download = (name: string, text: string): void => downloadText(name, 'application/json', text);

export function useBrowserHost({ editor, storage, examples, setBanner, onSaved, elk = workerElk }: Options): BrowserHost {
  const fileInput = useRef<HTMLInputElement | null>(null);
  const [flash, setFlash] = useState<string | null>(null);
  const flashTimer = useRef<ReturnType<typeof setTimeout> | null>(null);
  const say = useCallback((text: string) => {
    setFlash(text);
    if (flashTimer.current) clearTimeout(flashTimer.current);
    flashTimer.current = setTimeout(() => setFlash(null), 6000);
  }, []);

  const importNetlist = useCallback((text: string, name: string) => {
    say(`Importing ${name}…`);
    void importNetlistText(text, elk()).then((r) => {
      if (!r.ok) {
        setBanner({ kind: 'error', text: `${name} was not imported: ${r.messages.join('; ')}. Your current drawing is unchanged.` });
        return;
      }
      editor.load(r.doc, { label: `Import netlist ${name}` });
      setBanner(r.messages.length ? { kind: 'info', text: `${name} imported with notes: ${r.messages.join('; ')}.` } : null);
      say(`Imported ${name} as a tidy drawing (Undo brings back the previous drawing).`);
      editor.dispatch({ type: 'command', id: 'view.fit' });
    }, (e: unknown) => setBanner({ kind: 'error', text: `${name} was not imported: ${e instanceof Error ? e.message : String(e)}` }));
  }, [editor, elk, say, setBanner]);

  const openText = useCallback((text: string, name: string) => {
    if (isNetlistText(text)) { importNetlist(text, name); return; }
    const r = loadDrawing(text);
    if (!r.ok) {
      const kept = /unchanged|nothing was changed/i.test(r.reason) ? '' : ' Your current drawing is unchanged.';
      setBanner({ kind: 'error', text: `${name} was not opened: ${r.reason}${kept}` });
      return;
    }
    editor.load(r.doc, { label: `Open ${name}` });
    onSaved(editor.document);
    setBanner(r.migratedFrom !== undefined ? { kind: 'info', text: `${name} was saved by an older version (format ${r.migratedFrom}) and has been brought up to date.` } : null);
    say(`Opened ${name}.`);
    editor.dispatch({ type: 'command', id: 'view.fit' });
  }, [editor, onSaved, say, setBanner, importNetlist]);

  const openFileObject = useCallback((file: File) => {
    readFileText(file).then((t) => openText(t, file.name), (e: Error) => setBanner({ kind: 'error', text: `${file.name} could not be read: ${e.message}` }));
  }, [openText, setBanner]);

  useEffect(() => {
    editor.setHost({
      saveFile: (doc) => {
        try {
          download(fileNameFor(doc), saveDrawing(doc));
          onSaved(doc);
          say(`Saved as ${fileNameFor(doc)}.`);
        } catch (e) {
          setBanner({ kind: 'error', text: `Saving failed: ${(e as Error).message}` });
        }
      },
      openFile: () => fileInput.current?.click(),
      writeClipboard: (text) => {
        try { storage?.setItem(CLIPBOARD_KEY, text); } catch { /* storage full or off: system clipboard only */ }
        navigator.clipboard?.writeText(text).catch(() => undefined);
      },
      requestPaste: () => {
        const fromStorage = () => {
          const t = storage?.getItem(CLIPBOARD_KEY);
          if (t && isNetlistText(t)) importNetlist(t, 'the pasted netlist');
          else if (t) editor.dispatch({ type: 'paste', text: t });
          else say('Nothing to paste: copy parts first (here or in another tab of the app).');
        };
        const read = navigator.clipboard?.readText?.bind(navigator.clipboard);
        if (!read) { fromStorage(); return; }
        read().then((t) => {
          if (t && isNetlistText(t)) importNetlist(t, 'the pasted netlist');
          else if (t && t.includes('polesketch')) editor.dispatch({ type: 'paste', text: t });
          else fromStorage();
        }, fromStorage);
      },
      tidy: editorTidy(editor, (message, isError) => {
        if (isError) setBanner({ kind: 'error', text: message });
        else { setBanner(null); say(message); }
      }, elk),
    });
  }, [editor, storage, onSaved, say, setBanner, importNetlist, elk]);

  // Another tab copied parts.
  useEffect(() => {
    const onStorage = (e: StorageEvent) => {
      if (e.key === CLIPBOARD_KEY && e.newValue) say('Parts copied in another tab are ready to paste.');
    };
    window.addEventListener('storage', onStorage);
    return () => window.removeEventListener('storage', onStorage);
  }, [say]);

  // Restore the autosaved drawing once; else open the first example.
  const restored = useRef(false);
  useEffect(() => {
    if (restored.current) return;
    restored.current = true;
    if (!storage) return;
    const r = restoreAutosave(storage);
    if (r && r.ok) {
      editor.load(r.doc, { record: false });
      onSaved(editor.document);
      say('Restored the drawing from your last session.');
    } else {
      if (r && !r.ok) setBanner({ kind: 'error', text: `The autosaved drawing could not be restored: ${r.reason}` });
      if (examples[0]) { editor.load(examples[0].load(), { record: false }); onSaved(editor.document); }
    }
    editor.dispatch({ type: 'command', id: 'view.fit' });
  }, [editor, storage, examples, onSaved, say, setBanner]);

  // Autosave shortly after each change.
  const doc = editor.document;
  useEffect(() => {
    if (!storage) return;
    const t = setTimeout(() => {
      const r = autosave(storage, doc);
      if (!r.ok) say(r.reason);
    }, AUTOSAVE_DELAY_MS);
    return () => clearTimeout(t);
  }, [doc, storage, say]);

  return {
    fileInput,
    onFilePicked: (e) => {
      const f = e.target.files?.[0];
      e.target.value = '';
      if (f) openFileObject(f);
    },
    openFileObject,
    openText,
    newDrawing: () => {
      editor.load(emptyDocument(), { label: 'New drawing' });
      setBanner(null);
    },
    openExample: (id) => {
      const ex = examples.find((x) => x.id === id);
      if (!ex) return;
      editor.load(ex.load(), { label: `Open example ${ex.title}` });
      onSaved(editor.document);
      editor.dispatch({ type: 'command', id: 'view.fit' });
    },
    flash,
  };
}
