import { StrictMode } from 'react';
import { createRoot } from 'react-dom/client';
import { App } from './App';
import { startHistoryDriver } from './history/historyDriver';
import { startMapDriver } from './mapDriver';
import { firstWorkerAnswer } from '../workers/mapClient';
import './styles.css';
import { installTestHooks } from './testHooks';

const container = document.getElementById('root');
if (!container) throw new Error('index.html has no #root element');

installTestHooks();

/** `?baseline=cold` maps with one full search per pixel (the benchmark's baseline). */
function mapMode(): 'staged' | 'cold' {
  return new URLSearchParams(window.location.search).get('baseline') === 'cold' ? 'cold' : 'staged';
}

// The Map's workers start before React's first render, so that loading them overlaps it; the
// first job waits for them and maps the setup as it is then (normally with a link's scenario
// already applied by the first render's effects).
startMapDriver(mapMode());
// Every setup change from here on, the link's among them, is a step of the undo history.
startHistoryDriver();

// React's first render is one long task, and a worker's script loads only while the page's
// thread is free: the render waits until a worker answers (up to RENDER_WAIT_MS), so that the
// workers warm up while React renders.
const RENDER_WAIT_MS = 400;
void Promise.race([
  firstWorkerAnswer,
  new Promise((resolve) => setTimeout(resolve, RENDER_WAIT_MS)),
]).then(() =>
  createRoot(container).render(
    <StrictMode>
      <App />
    </StrictMode>,
  ),
);
