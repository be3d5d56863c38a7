/** Home: pick the site (remembered), resume an open round, start one, go to set-up and spots. */
import { h, replace } from '../ui/h';
import { prefs } from '../state';
import { setSite } from '../app';
import { loadSetup, loadSites, refreshRecent, roundsOfSite } from '../data';
import { routeOf } from '../round/logic';
import { refreshOpenFollowUps } from '../follow-ups';
import { fmtDateTime } from '../ui/format';
import { pickOne } from '../ui/sheet';
import type { Site } from '../../core/schemas';

export async function homePage(root: HTMLElement): Promise<() => void> {
  let alive = true;
  await renderHome(root, () => alive, true);
  return () => { alive = false; };
}

async function renderHome(root: HTMLElement, alive: () => boolean, refresh: boolean): Promise<void> {
  const body = h('div', { class: 'page home' }, h('p', { class: 'muted' }, 'Loading…'));
  // First paint shows 'Loading…'; a refresh swaps the finished page in at once.
  if (refresh) root.replaceChildren(body);

  let sites: Site[] = [];
  let sitesFromCache = false;
  try {
    const l = await loadSites();
    sites = l.data;
    sitesFromCache = l.fromCache;
  } catch (e) {
    replace(body, h('div', { class: 'error-box' }, `No site list: ${(e as Error).message}. Connect once to load the set-up.`));
    root.replaceChildren(body);
    return;
  }
  let siteId = prefs.siteId;
  if (!siteId || !sites.some((s) => s.id === siteId)) siteId = sites[0]?.id ?? null;
  if (!siteId) {
    replace(body,
      h('h1', null, 'Welcome to chargewalk'),
      h('p', null, 'There is no site yet. Set one up: the site, its areas, the spots on your route, your meters and limit sets.'),
      h('a', { class: 'btn btn-primary btn-big', href: '#/setup/sites' }, 'Set up a site'));
    root.replaceChildren(body);
    return;
  }
  const site = sites.find((s) => s.id === siteId)!;
  setSite(site.id, site.name);

  const setup = await loadSetup(site.id).catch(() => null);
  const rounds = await roundsOfSite(site.id);
  const open = rounds.filter((r) => !r.endedAt);
  const recent = rounds.filter((r) => r.endedAt).slice(0, 5);

  const chooseSite = async () => {
    const v = await pickOne('Site', sites.map((s) => ({ value: s.id, label: s.name, hint: s.timeZone })), site.id);
    if (v && v !== site.id) { setSite(v, sites.find((s) => s.id === v)?.name ?? null); await renderHome(root, alive, true); }
  };

  const spots = setup ? routeOf(setup.data) : [];
  const spotsByArea = setup ? setup.data.areas.map((a) => ({ area: a, spots: spots.filter((s) => s.areaId === a.id) })).filter((g) => g.spots.length) : [];

  replace(body,
    h('section', { class: 'card home-site' },
      h('div', { class: 'row between wrap' },
        h('div', null,
          h('p', { class: 'eyebrow' }, 'Site'),
          h('h1', { class: 'site-name' }, site.name),
          sitesFromCache || setup?.fromCache ? h('p', { class: 'muted' }, `Offline: set-up as of ${fmtDateTime(setup?.fetchedAt)}`) : null),
        sites.length > 1 ? h('button', { type: 'button', class: 'btn', onclick: chooseSite }, 'Change site') : null),
      open.length
        ? h('div', { class: 'stack' },
          ...open.map((r) => h('a', { class: 'btn btn-primary btn-big', href: `#/round/${r.id}`, dataset: { testid: 'resume-round' } },
            `Resume round · ${r.surveyor} · started ${fmtDateTime(r.startedAt)}`)),
          h('a', { class: 'btn btn-big', href: '#/round/new', dataset: { testid: 'start-round' } }, 'Start another round'))
        : h('a', { class: 'btn btn-primary btn-big', href: '#/round/new', dataset: { testid: 'start-round' } }, 'Start a round'),
      h('nav', { class: 'home-nav', 'aria-label': 'Tools' },
        h('a', { class: 'btn', href: '#/scan', dataset: { testid: 'nav-scan' } }, 'Scan label'),
        h('a', { class: 'btn', href: '#/review', dataset: { testid: 'nav-review' } }, 'Review'),
        h('a', { class: 'btn', href: '#/plans', dataset: { testid: 'nav-plans' } }, 'Plans'),
        h('a', { class: 'btn', href: '#/labels', dataset: { testid: 'nav-labels' } }, 'Labels'),
        h('a', { class: 'btn', href: '#/data', dataset: { testid: 'nav-data' } }, 'Data'),
        h('a', { class: 'btn', href: '#/setup' }, 'Set-up'),
        h('a', { class: 'btn', href: '#/outbox' }, 'Outbox'))),
    recent.length ? h('section', { class: 'card' },
      h('h2', null, 'Recent rounds'),
      h('ul', { class: 'list' }, recent.map((r) => h('li', null,
        h('a', { class: 'list-link', href: `#/round/${r.id}/summary` },
          h('span', null, fmtDateTime(r.startedAt)), h('span', { class: 'muted' }, r.surveyor)))))) : null,
    h('section', { class: 'card' },
      h('h2', null, 'Spots'),
      spotsByArea.length === 0 ? h('p', { class: 'muted' }, 'No spots yet.') : null,
      ...spotsByArea.map((g) => h('div', { class: 'area-group' },
        h('h3', null, g.area.name),
        h('ul', { class: 'list spot-links' }, g.spots.map((s) => h('li', null,
          h('a', { class: 'list-link', href: `#/spot/${s.id}` },
            h('span', { class: 'code' }, s.code), h('span', null, s.name)))))))),
  );

  // A background refresh finishes late: never paint home over the screen the user went to meanwhile.
  if (!refresh) { if (!alive()) return; root.replaceChildren(body); }
  // Keep recent rounds and readings cached for offline rounds (best effort, in the
  // background); then show rounds another tablet left open.
  if (refresh && !setup?.fromCache) {
    void refreshOpenFollowUps(site.id).catch(() => undefined); // shown on the round screen, offline too
    void refreshRecent(site.id).then(() => { if (alive() && root.contains(body)) void renderHome(root, alive, false); }).catch(() => undefined);
  }
}
