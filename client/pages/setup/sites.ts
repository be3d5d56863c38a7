import { h, replace } from '../../ui/h';
import { prefs } from '../../state';
import { setSite } from '../../app';
import { SiteInputSchema, type Site } from '../../../core/schemas';
import { buildFields, validateAndSend } from './builder';
import { formCard, openForm, sectionLayout } from './common';
import type { SetupCtx } from './index';

function timeZones(): string[] {
  const intl = Intl as unknown as { supportedValuesOf?: (k: string) => string[] };
  const list = intl.supportedValuesOf ? intl.supportedValuesOf('timeZone') : [];
  return list.length ? list : ['UTC', 'Europe/Berlin', 'Europe/London', 'America/New_York'];
}

export function sitesSection(ctx: SetupCtx): void {
  const { formSlot, list } = sectionLayout(ctx.host, 'Sites', 'New site', () => edit(null));
  function edit(site: Site | null): void {
    const tzDefault = Intl.DateTimeFormat().resolvedOptions().timeZone || 'UTC';
    const f = buildFields([
      { kind: 'text', path: 'name', label: 'Site name' },
      { kind: 'select', path: 'timeZone', label: 'Time zone', hint: 'Weeks and dates in reviews follow this zone', options: timeZones().map((z) => ({ value: z, label: z })) },
      { kind: 'textarea', path: 'notes', label: 'Notes' },
    ], site ?? { timeZone: tzDefault });
    const form = formCard(site ? `Edit ${site.name}` : 'New site', f.el, async () => {
      const saved = await validateAndSend<Site>(form, SiteInputSchema, f.read(), site ? 'PUT' : 'POST', site ? `/api/sites/${site.id}` : '/api/sites');
      if (saved) { setSite(saved.id, saved.name); await ctx.reload(); }
    }, () => replace(formSlot));
    openForm(formSlot, form);
  }
  replace(list, ctx.sites.length === 0 ? h('p', { class: 'muted' }, 'No site yet.') : h('ul', { class: 'list' }, ctx.sites.map((s) => h('li', { class: 'list-row' },
    h('span', { class: 'grow' }, h('strong', null, s.name), h('span', { class: 'muted' }, ` · ${s.timeZone}`), s.id === prefs.siteId ? h('span', { class: 'chip chip-on' }, 'current') : null),
    s.id !== prefs.siteId ? h('button', { type: 'button', class: 'btn btn-small', onclick: async () => { setSite(s.id, s.name); await ctx.reload(); } }, 'Use this site') : null,
    h('button', { type: 'button', class: 'btn btn-small', onclick: () => edit(s) }, 'Edit')))));
}
