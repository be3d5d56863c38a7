/**
 * Set-up: sites, areas, spots (ordered route), meters, limit sets. Set-up
 * changes go straight to the server (they are office work, not field work) and
 * need a connection; every form is validated with the shared schema first.
 */
import { h, replace } from '../../ui/h';
import { prefs } from '../../state';
import { setSite } from '../../app';
import { loadSites, refreshSetup, invalidateSetup, loadSetup } from '../../data';
import type { SetupBundle, Site } from '../../../core/schemas';
import { sitesSection } from './sites';
import { areasSection } from './areas';
import { spotsSection } from './spots';
import { metersSection } from './meters';
import { limitSetsSection } from './limit-sets';

export interface SetupCtx {
  host: HTMLElement;
  sites: Site[];
  bundle: SetupBundle | null;
  /** Reload from the server and render the section again. */
  reload(): Promise<void>;
}

const SECTIONS = [
  { id: 'sites', label: 'Sites', render: sitesSection },
  { id: 'areas', label: 'Areas', render: areasSection },
  { id: 'spots', label: 'Spots and route', render: spotsSection },
  { id: 'meters', label: 'Meters', render: metersSection },
  { id: 'limit-sets', label: 'Limit sets', render: limitSetsSection },
] as const;

export async function setupPage(root: HTMLElement, params: Record<string, string>): Promise<void> {
  const sectionId = params.section ?? 'sites';
  const section = SECTIONS.find((s) => s.id === sectionId) ?? SECTIONS[0];
  const host = h('div', { class: 'setup-section' });
  const offline = h('p', { class: 'banner banner-info', hidden: true });
  root.append(h('div', { class: 'page setup' },
    h('div', { class: 'row between wrap' }, h('h1', null, 'Set-up'), h('a', { class: 'btn', href: '#/' }, 'Home')),
    h('nav', { class: 'tabs', 'aria-label': 'Set-up sections' }, SECTIONS.map((s) => h('a', {
      class: `tab${s.id === section.id ? ' is-on' : ''}`, href: `#/setup/${s.id}`, 'aria-current': s.id === section.id ? 'page' : undefined,
    }, s.label))),
    offline, host));

  const ctx: SetupCtx = {
    host, sites: [], bundle: null,
    async reload() {
      const l = await loadSites().catch(() => null);
      ctx.sites = l?.data ?? [];
      let siteId = prefs.siteId;
      if (!siteId || !ctx.sites.some((s) => s.id === siteId)) siteId = ctx.sites[0]?.id ?? null;
      if (siteId) {
        invalidateSetup(siteId);
        const b = await refreshSetup(siteId).catch(() => loadSetup(siteId!).catch(() => null));
        ctx.bundle = b?.data ?? null;
        if (ctx.bundle) setSite(ctx.bundle.site.id, ctx.bundle.site.name);
        offline.hidden = !b?.fromCache;
        offline.textContent = b?.fromCache ? 'Offline: showing the last known set-up. Changes need a connection.' : '';
      } else ctx.bundle = null;
      replace(host);
      if (section.id !== 'sites' && !ctx.bundle) {
        host.append(h('p', { class: 'muted' }, 'Create a site first.'), h('a', { class: 'btn btn-primary', href: '#/setup/sites' }, 'Sites'));
        return;
      }
      section.render(ctx);
    },
  };
  await ctx.reload();
}
