import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './ui/app/App';

const root = document.getElementById('root');
if (root === null) throw new Error('index.html has no #root element');

const bridge = window.weighbridge;
if (bridge === undefined) {
  // Opened outside the desktop app and outside the harness: say so instead of a blank page.
  root.textContent = 'Weighbridge runs inside its desktop window or the browser harness (npm run dev:browser).';
} else {
  createRoot(root).render(
    <StrictMode>
      <App bridge={bridge} />
    </StrictMode>,
  );
}
