import { h, replace } from '../../ui/h';
import { api } from '../../api';
import { field, numberInput, readNumber, showFieldErrors, textInput } from '../../ui/form';
import { LimitSetInputSchema, type LimitSet } from '../../../core/schemas';
import { LIMIT_METRICS, LIMIT_METRIC_INFO, type LimitMetric } from '../../../core/limits';
import { formatSi } from '../../../core/units/format';
import { pickOne } from '../../ui/sheet';
import { validateAndSend } from './builder';
import { formCard, openForm, sectionLayout } from './common';
import type { SetupCtx } from './index';

interface RuleDraft { metric: LimitMetric; warn: number | null; alarm: number | null; source: string }
interface Template { id?: string; name: string; description?: string; rules: RuleDraft[] }

export function limitSetsSection(ctx: SetupCtx): void {
  const bundle = ctx.bundle!;
  const { formSlot, list } = sectionLayout(ctx.host, 'Limit sets', 'New limit set', () => edit(null));

  function edit(set: LimitSet | null, start?: Template): void {
    const base = start ?? set;
    const name = textInput(base?.name ?? '');
    const description = h('textarea', { rows: 2 });
    description.value = base?.description ?? '';
    let rules: RuleDraft[] = (base?.rules ?? [{ metric: 'fieldVPerM', warn: null, alarm: null, source: '' }]).map((r) => ({ ...r }));
    const table = h('div', { class: 'rules' });
    const rows: { metric: HTMLSelectElement; warn: HTMLInputElement; alarm: HTMLInputElement; source: HTMLInputElement }[] = [];

    const collect = () => rows.map((r) => ({ metric: r.metric.value as LimitMetric, warn: readNumber(r.warn), alarm: readNumber(r.alarm), source: r.source.value }));
    const renderRules = () => {
      rows.length = 0;
      replace(table,
        h('p', { class: 'field-error', dataset: { errorFor: 'rules' } }),
        rules.map((r, i) => {
          const metric = h('select', { 'aria-label': `rule ${i + 1} metric` }, LIMIT_METRICS.map((m) => h('option', { value: m, selected: m === r.metric ? true : undefined }, `${LIMIT_METRIC_INFO[m].label} (${LIMIT_METRIC_INFO[m].unit})`)));
          const warn = numberInput(r.warn);
          const alarm = numberInput(r.alarm);
          const source = textInput(r.source, { placeholder: 'standard and clause, or the site\'s own rule' });
          rows.push({ metric, warn, alarm, source });
          const unit = LIMIT_METRIC_INFO[r.metric].unit;
          return h('fieldset', { class: 'rule-row' },
            h('legend', null, `Rule ${i + 1}`),
            field('Metric', metric, `rules.${i}.metric`),
            field(`Warn at (${unit})`, warn, `rules.${i}.warn`, r.warn !== null ? formatSi(r.warn, unit) : undefined),
            field(`Alarm at (${unit})`, alarm, `rules.${i}.alarm`, r.alarm !== null ? formatSi(r.alarm, unit) : undefined),
            field('Source', source, `rules.${i}.source`),
            h('button', { type: 'button', class: 'btn btn-small btn-danger-outline', onclick: () => { rules = collect(); rules.splice(i, 1); renderRules(); } }, 'Remove rule'));
        }),
        h('button', { type: 'button', class: 'btn', onclick: () => { rules = [...collect(), { metric: 'surfaceVoltageV', warn: null, alarm: null, source: '' }]; renderRules(); } }, 'Add rule'));
    };
    renderRules();

    const form = formCard(set ? `Edit ${set.name}` : 'New limit set', [
      field('Name', name, 'name'),
      field('Description', description, 'description'),
      table,
    ], async () => {
      const raw = { siteId: bundle.site.id, name: name.value, description: description.value, rules: collect().map((r) => ({ ...r, warn: Number.isNaN(r.warn) ? 'not a number' : r.warn, alarm: Number.isNaN(r.alarm) ? 'not a number' : r.alarm })) };
      const saved = await validateAndSend<LimitSet>(form, LimitSetInputSchema, raw, set ? 'PUT' : 'POST', set ? `/api/limit-sets/${set.id}` : '/api/limit-sets');
      if (saved) await ctx.reload();
    }, () => replace(formSlot), !set ? h('button', { type: 'button', class: 'btn', onclick: () => void fromTemplate() }, 'Start from a template') : null);
    openForm(formSlot, form);

    async function fromTemplate(): Promise<void> {
      try {
        const r = await api<{ templates: Template[] }>('GET', '/api/limit-templates');
        if (!r.templates?.length) { showFieldErrors(form, [], 'No templates on the server.'); return; }
        const pick = await pickOne('Start from a template', r.templates.map((t, i) => ({ value: String(i), label: t.name, hint: t.description })));
        if (pick !== null) edit(null, r.templates[Number(pick)]);
      } catch (e) {
        showFieldErrors(form, [], `Templates are not available: ${(e as Error).message}`);
      }
    }
  }

  replace(list, bundle.limitSets.length === 0 ? h('p', { class: 'muted' }, 'No limit set yet.') : h('ul', { class: 'list' }, bundle.limitSets.map((l) => h('li', { class: 'list-row' },
    h('div', { class: 'grow' }, h('strong', null, l.name),
      h('ul', { class: 'rule-summary' }, l.rules.map((r) => {
        const u = LIMIT_METRIC_INFO[r.metric].unit;
        return h('li', null, `${LIMIT_METRIC_INFO[r.metric].label}: warn ${r.warn === null ? '—' : formatSi(r.warn, u)}, alarm ${r.alarm === null ? '—' : formatSi(r.alarm, u)} · ${r.source}`);
      }))),
    h('button', { type: 'button', class: 'btn btn-small', onclick: () => edit(l) }, 'Edit')))));
}
