// Visual-check harness (not shipped): the results panel at its real side-panel width on the live
// store (Web Worker runner), fed one example drawing: ?example=<id>.
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { ResultsPanel } from '../../../src/panels/ResultsPanel';
import { createLiveStore } from '../../../src/live/index';
import { EXAMPLE_DRAWINGS } from '../../../src/examples/index';
import '../../../src/app.css';

const q = new URLSearchParams(location.search);
const ex = EXAMPLE_DRAWINGS.find((e) => e.id === (q.get('example') ?? 'two-stage-miller-unity')) ?? EXAMPLE_DRAWINGS[0];
const store = createLiveStore();
(window as unknown as { store: typeof store }).store = store;
store.actions.submit(ex.load());
createRoot(document.getElementById('root')!).render(
  <StrictMode>
    <div style={{ display: 'flex', height: '100vh', background: 'var(--surface)' }}>
      <div style={{ flex: 1 }} />
      <aside className="side" style={{ width: 300 }} aria-label="Inspector">
        <div className="inspector"><h2>Properties</h2><p className="empty-note">(inspector)</p></div>
        <ResultsPanel store={store} />
      </aside>
    </div>
  </StrictMode>,
);
