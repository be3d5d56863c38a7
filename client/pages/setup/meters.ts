import { h, replace } from '../../ui/h';
import { METER_MODES, MeterInputSchema, type Meter } from '../../../core/schemas';
import { READING_UNITS } from '../../../core/units';
import { isCalibrationOverdue } from '../../../core/readings/derive';
import { buildFields, validateAndSend } from './builder';
import { formCard, openForm, sectionLayout } from './common';
import type { SetupCtx } from './index';

export function metersSection(ctx: SetupCtx): void {
  const bundle = ctx.bundle!;
  const { formSlot, list } = sectionLayout(ctx.host, 'Meters', 'New meter', () => edit(null));
  function edit(meter: Meter | null): void {
    const f = buildFields([
      { kind: 'text', path: 'serial', label: 'Serial number' },
      { kind: 'text', path: 'label', label: 'Label', hint: 'What people call it, e.g. "Meter A"' },
      { kind: 'checks', path: 'modes', label: 'Reading modes', options: METER_MODES.map((m) => ({ value: m, label: m === 'field' ? 'field (V/m …)' : 'surface voltage (V at the calibrated distance)' })) },
      { kind: 'number', path: 'calibratedDistanceM', label: 'Calibrated distance (m)', hint: 'For surface-voltage mode; 1 inch = 0.0254 m', empty: 'null' },
      { kind: 'number', path: 'accuracyRel', label: 'Accuracy (fraction)', hint: '0.05 means ±5 % of the reading', empty: 'omit' },
      { kind: 'number', path: 'geometryFactor', label: 'Geometry factor', hint: '1 for a small probe, up to 2 for a wide flat grounded face', empty: 'omit' },
      { kind: 'date', path: 'calibrationDue', label: 'Calibration due' },
      { kind: 'select', path: 'defaultUnit', label: 'Default unit', options: READING_UNITS.map((u) => ({ value: u, label: u })) },
    ], meter ?? { modes: ['field'], accuracyRel: 0.05, geometryFactor: 1, defaultUnit: 'kV/m' });
    const form = formCard(meter ? `Edit ${meter.label || meter.serial}` : 'New meter', f.el, async () => {
      const saved = await validateAndSend<Meter>(form, MeterInputSchema, { ...f.read(), siteId: bundle.site.id }, meter ? 'PUT' : 'POST', meter ? `/api/meters/${meter.id}` : '/api/meters');
      if (saved) await ctx.reload();
    }, () => replace(formSlot));
    openForm(formSlot, form);
  }
  const now = new Date().toISOString();
  replace(list, bundle.meters.length === 0 ? h('p', { class: 'muted' }, 'No meter yet.') : h('ul', { class: 'list' }, bundle.meters.map((m) => {
    const overdue = isCalibrationOverdue(m.calibrationDue, now);
    return h('li', { class: 'list-row' },
      h('span', { class: 'grow' }, h('strong', null, m.label || m.serial), h('span', { class: 'muted' }, ` · ${m.serial} · ${m.modes.join(' + ')} · ${m.defaultUnit}`),
        h('span', { class: overdue ? 'chip cal-chip' : 'chip chip-on' }, overdue ? `calibration overdue since ${m.calibrationDue}` : `calibration due ${m.calibrationDue}`)),
      h('button', { type: 'button', class: 'btn btn-small', onclick: () => edit(m) }, 'Edit'));
  })));
}
