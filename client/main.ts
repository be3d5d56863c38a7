/**
 * Boot: top bar, routes, outbox sync, service worker. Pages live in pages/;
 * the offline machinery in offline/.
 */
import './ui/review.css';
import { route, startRouter } from './router';
import { mountTopbar } from './ui/topbar';
import { startSync } from './offline/sync';
import { keepStorage } from './offline/storage';
import { homePage } from './pages/home';
import { roundStartPage } from './pages/round-start';
import { roundPage } from './pages/round';
import { summaryPage } from './pages/summary';
import { spotPage } from './pages/spot';
import { setupPage } from './pages/setup/index';
import { outboxPage } from './pages/outbox';
import { sweepPage } from './pages/sweep';
import { modelsPage } from './pages/models';
import { reviewPage } from './pages/review';
import { planPage, plansPage } from './pages/plan';
import { labelsPage } from './pages/labels';
import { scanPage } from './pages/scan';
import { dataPage } from './pages/data';

route('/', homePage);
route('/round/new', roundStartPage);
route('/round/:id', roundPage);
route('/round/:id/summary', summaryPage);
route('/spot/:id', spotPage);
route('/setup', setupPage);
route('/setup/:section', setupPage);
route('/outbox', outboxPage);
route('/sweep/:spotId', sweepPage);
route('/models', modelsPage);
route('/review', reviewPage);
route('/review/:week', reviewPage);
route('/plans', plansPage);
route('/plan/:areaId', planPage);
route('/labels', labelsPage);
route('/scan', scanPage);
route('/scan/:code', scanPage);
route('/data', dataPage);

mountTopbar(document.getElementById('topbar')!);
startRouter();
startSync();
void keepStorage(); // the outbox must survive a full tablet: ask for persistent storage

// Not under the Vite dev server (import.meta.hot): a worker there would cache dev modules.
if ('serviceWorker' in navigator && !import.meta.hot) {
  // The shell (HTML, JS, CSS, icons) is cached by the worker; /api never is:
  // records live in IndexedDB and API calls always go to the network.
  window.addEventListener('load', () => {
    navigator.serviceWorker.register('/sw.js', { scope: '/' }).catch((e) => console.warn('service worker not registered', e));
  });
}
