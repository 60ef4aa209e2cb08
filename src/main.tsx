// Browser entry: one editor for the page, the example drawings, and the app on #root.
/// <reference types="vite/client" />
import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './App';
import { createEditor } from './editor/editor';
import { EXAMPLE_DRAWINGS } from './examples';
import './app.css';

const editor = createEditor();
const examples = [...EXAMPLE_DRAWINGS];
const root = document.getElementById('root');
if (root) {
  createRoot(root).render(
    <StrictMode>
      <App editor={editor} examples={examples} />
    </StrictMode>,
  );
}
