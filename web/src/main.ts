/**
 * The dashboard's entry: picks the view from the address (`/` the runs list, `/runs/<id>` one
 * run; the server answers index.html for both) and shows what went wrong in words if loading
 * fails.
 */
import './styles.css';
import { el, replaceChildren } from './dom.ts';
import { runIdOfPath } from './route.ts';
import { showRunPage } from './views/runPage.ts';
import { showRunsList } from './views/runsList.ts';

async function start(): Promise<void> {
  const root = document.getElementById('app');
  if (root === null) return;
  try {
    const runId = runIdOfPath(window.location.pathname);
    if (runId !== null) await showRunPage(root, runId);
    else await showRunsList(root);
  } catch (error) {
    replaceChildren(
      root,
      el('h1', {}, 'The dashboard could not load'),
      el('p', {}, (error as Error).message),
      el('p', {}, 'Check that the Meniscus server is running, then reload the page.'),
    );
  }
}

void start();
