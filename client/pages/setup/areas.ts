import { h, replace } from '../../ui/h';
import { AREA_KIND_LABEL, AREA_KINDS, AreaInputSchema, GAS_GROUPS, ZONES, type Area } from '../../../core/schemas';
import { buildFields, validateAndSend } from './builder';
import { formCard, openForm, sectionLayout } from './common';
import { SUBSTANCE_HINT, substanceOptions } from './substances';
import type { SetupCtx } from './index';

export function areasSection(ctx: SetupCtx): void {
  const bundle = ctx.bundle!;
  const { formSlot, list } = sectionLayout(ctx.host, 'Areas', 'New area', () => edit(null));
  function edit(area: Area | null): void {
    const f = buildFields([
      { kind: 'text', path: 'name', label: 'Area name' },
      { kind: 'select', path: 'kind', label: 'Kind', options: AREA_KINDS.map((k) => ({ value: k, label: AREA_KIND_LABEL[k] })) },
      { kind: 'select', path: 'zone', label: 'Zone', hint: 'Hazardous zones only: 0/1/2 gas, 20/21/22 dust', empty: 'null', cast: 'number', options: [{ value: '', label: 'none' }, ...ZONES.map((z) => ({ value: String(z), label: `zone ${z}` }))] },
      { kind: 'select', path: 'gasGroup', label: 'Gas group', empty: 'null', options: [{ value: '', label: 'none' }, ...GAS_GROUPS.map((g) => ({ value: g, label: g }))] },
      { kind: 'select', path: 'substanceId', label: 'Substance in the air', hint: SUBSTANCE_HINT, empty: 'null', options: substanceOptions(area?.substanceId) },
      { kind: 'number', path: 'dustMieJ', label: 'Dust MIE (J)', hint: 'Optional: minimum ignition energy of the dust, joules', empty: 'null' },
      { kind: 'select', path: 'limitSetId', label: 'Limit set', empty: 'null', options: [{ value: '', label: 'none' }, ...bundle.limitSets.map((l) => ({ value: l.id, label: l.name }))] },
      { kind: 'textarea', path: 'notes', label: 'Notes' },
    ], area ?? { kind: 'epa' });
    const form = formCard(area ? `Edit ${area.name}` : 'New area', f.el, async () => {
      const raw = { ...f.read(), siteId: bundle.site.id };
      const saved = await validateAndSend<Area>(form, AreaInputSchema, raw, area ? 'PUT' : 'POST', area ? `/api/areas/${area.id}` : '/api/areas');
      if (saved) await ctx.reload();
    }, () => replace(formSlot));
    openForm(formSlot, form);
  }
  replace(list, bundle.areas.length === 0 ? h('p', { class: 'muted' }, 'No area yet.') : h('ul', { class: 'list' }, bundle.areas.map((a) => h('li', { class: 'list-row' },
    h('span', { class: 'grow' }, h('strong', null, a.name),
      h('span', { class: 'muted' }, ` · ${AREA_KIND_LABEL[a.kind]}${a.zone !== null ? ` · zone ${a.zone}` : ''}${a.gasGroup ? ` · ${a.gasGroup}` : ''} · limits: ${bundle.limitSets.find((l) => l.id === a.limitSetId)?.name ?? 'none'}`)),
    h('button', { type: 'button', class: 'btn btn-small', onclick: () => edit(a) }, 'Edit')))));
}
