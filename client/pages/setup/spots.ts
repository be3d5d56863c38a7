import { h, replace } from '../../ui/h';
import { api, ApiError } from '../../api';
import { openSheet, toast } from '../../ui/sheet';
import { fmtDistance } from '../../ui/format';
import {
  ESTIMATE_MODELS, MATERIAL_CLASSES, OBJECT_KINDS, SpotInputSchema, type Spot,
} from '../../../core/schemas';
import { DISTANCE_UNITS } from '../../../core/units';
import { buildFields, validateAndSend, type FieldSpec } from './builder';
import { formCard, openForm, sectionLayout } from './common';
import type { SetupCtx } from './index';

const GEOMETRY: { key: string; label: string; hint: string }[] = [
  { key: 'radiusM', label: 'Radius (m)', hint: 'sphere, roll, hose, disk' },
  { key: 'lengthM', label: 'Length (m)', hint: 'roll, hose, line' },
  { key: 'widthM', label: 'Width (m)', hint: 'rectangle, panel, web' },
  { key: 'heightM', label: 'Height (m)', hint: 'rectangle, panel' },
  { key: 'separationM', label: 'Separation (m)', hint: 'dipole' },
  { key: 'heightAboveGroundM', label: 'Height above ground (m)', hint: 'image charge' },
  { key: 'thicknessM', label: 'Layer thickness (m)', hint: 'layer on ground' },
  { key: 'relativePermittivity', label: 'Relative permittivity', hint: 'layer on ground, 1 to 1000' },
  { key: 'groundBehindM', label: 'Ground behind (m)', hint: 'sheet: distance to the ground behind' },
  { key: 'capacitanceF', label: 'Capacitance (F)', hint: 'isolated conductor, e.g. 1e-10' },
];

export function spotsSection(ctx: SetupCtx): void {
  const bundle = ctx.bundle!;
  const { formSlot, list } = sectionLayout(ctx.host, 'Spots and route', 'New spot', () => edit(null));
  if (bundle.areas.length === 0) { replace(list, h('p', { class: 'muted' }, 'Create an area first.')); return; }

  function edit(spot: Spot | null): void {
    const specs: FieldSpec[] = [
      { kind: 'select', path: 'areaId', label: 'Area', options: bundle.areas.map((a) => ({ value: a.id, label: a.name })) },
      { kind: 'text', path: 'name', label: 'Spot name' },
      { kind: 'text', path: 'code', label: 'Label code', hint: 'Short code on the printed label: letters, digits, dashes' },
      { kind: 'select', path: 'objectKind', label: 'Object', options: OBJECT_KINDS.map((k) => ({ value: k, label: k })) },
      { kind: 'select', path: 'materialClass', label: 'Material', options: MATERIAL_CLASSES.map((k) => ({ value: k, label: k })) },
      { kind: 'select', path: 'model', label: 'Estimate model', empty: 'null', options: [{ value: '', label: 'none' }, ...ESTIMATE_MODELS.map((k) => ({ value: k, label: k }))] },
      { kind: 'number', path: 'defaultDistance.value', label: 'Default distance', empty: 'null' },
      { kind: 'select', path: 'defaultDistance.unit', label: 'Distance unit', options: DISTANCE_UNITS.map((u) => ({ value: u, label: u })) },
      { kind: 'number', path: 'distanceUncertaintyM', label: 'Distance uncertainty (m)', hint: 'Optional, e.g. 0.005', empty: 'null' },
      ...GEOMETRY.map((g): FieldSpec => ({ kind: 'number', path: `geometry.${g.key}`, label: g.label, hint: g.hint, empty: 'omit' })),
      { kind: 'textarea', path: 'notes', label: 'Notes' },
    ];
    const f = buildFields(specs, spot ?? { areaId: bundle.areas[0]!.id, objectKind: 'workstation', materialClass: 'unknown', defaultDistance: { value: 10, unit: 'cm' } });
    const form = formCard(spot ? `Edit ${spot.name}` : 'New spot', f.el, async () => {
      const raw = f.read();
      const areaSpots = bundle.spots.filter((s) => s.areaId === raw.areaId);
      raw.routePosition = spot && spot.areaId === raw.areaId ? spot.routePosition : areaSpots.reduce((m, s) => Math.max(m, s.routePosition + 1), 0);
      if (!raw.geometry) raw.geometry = {};
      const saved = await validateAndSend<Spot>(form, SpotInputSchema, raw, spot ? 'PUT' : 'POST', spot ? `/api/spots/${spot.id}` : '/api/spots');
      if (saved) await ctx.reload();
    }, () => replace(formSlot), spot && !spot.retiredAt ? h('button', {
      type: 'button', class: 'btn btn-danger-outline', onclick: async () => {
        const input = h('input', { type: 'text', class: 'input-big', maxlength: 500, 'aria-label': 'Reason' });
        const reason = await openSheet(`Retire ${spot.name}`, (close) => [
          h('p', { class: 'sheet-message' }, 'The spot leaves the route; its readings stay.'),
          input,
          h('div', { class: 'row gap' },
            h('button', { type: 'button', class: 'btn btn-danger', onclick: () => { if (input.value.trim()) close(input.value.trim()); } }, 'Retire'),
            h('button', { type: 'button', class: 'btn', onclick: () => close(null) }, 'Cancel')),
        ]) as string | null;
        if (!reason) return;
        try { await api('POST', `/api/spots/${spot.id}/retire`, { reason }); await ctx.reload(); } catch (e) { toast((e as Error).message, 'error'); }
      },
    }, 'Retire spot') : null);
    form.classList.add('spot-form');
    openForm(formSlot, form);
  }

  async function move(areaId: string, spots: Spot[], i: number, dir: -1 | 1): Promise<void> {
    const j = i + dir;
    if (j < 0 || j >= spots.length) return;
    const ids = spots.map((s) => s.id);
    [ids[i], ids[j]] = [ids[j]!, ids[i]!];
    try {
      await api('PUT', `/api/areas/${areaId}/route`, { spotIds: ids });
      await ctx.reload();
    } catch (e) {
      toast(e instanceof ApiError ? e.message : 'Route changes need a connection', 'error');
    }
  }

  replace(list, bundle.areas.map((a) => {
    const spots = bundle.spots.filter((s) => s.areaId === a.id && !s.retiredAt).sort((x, y) => x.routePosition - y.routePosition || x.name.localeCompare(y.name));
    const retired = bundle.spots.filter((s) => s.areaId === a.id && s.retiredAt);
    return h('div', { class: 'area-group' },
      h('h3', null, `${a.name} · route`),
      spots.length === 0 ? h('p', { class: 'muted' }, 'No spots.') : h('ol', { class: 'list route-edit' }, spots.map((s, i) => h('li', { class: 'list-row' },
        h('span', { class: 'route-pos' }, String(i + 1)),
        h('span', { class: 'grow' }, h('span', { class: 'code' }, s.code), ` ${s.name}`, h('span', { class: 'muted' }, ` · ${s.objectKind} · ${fmtDistance(s.defaultDistance)}`)),
        h('button', { type: 'button', class: 'btn btn-icon', 'aria-label': `move ${s.name} up`, disabled: i === 0 || undefined, onclick: () => void move(a.id, spots, i, -1) }, '▲'),
        h('button', { type: 'button', class: 'btn btn-icon', 'aria-label': `move ${s.name} down`, disabled: i === spots.length - 1 || undefined, onclick: () => void move(a.id, spots, i, 1) }, '▼'),
        h('button', { type: 'button', class: 'btn btn-small', onclick: () => edit(s) }, 'Edit')))),
      retired.length ? h('p', { class: 'muted' }, `Retired: ${retired.map((s) => s.code).join(', ')}`) : null);
  }));
}
