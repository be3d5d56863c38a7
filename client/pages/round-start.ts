/**
 * Start a round: who walks (remembered), ambient RH and temperature on the
 * number pad, which meter (its calibration status shown). Saved to the outbox,
 * so a round starts with no network too.
 */
import { z } from 'zod';
import { h, replace } from '../ui/h';
import { numpad } from '../ui/numpad';
import { currentSetup } from '../app';
import { startRound } from '../data';
import { prefs } from '../state';
import { routeOf } from '../round/logic';
import { newId } from '../../core/ids/uuidv7';
import { isCalibrationOverdue } from '../../core/readings/derive';
import { RoundInputSchema } from '../../core/schemas';
import { showFieldErrors, zodFields } from '../ui/form';
import { navigate } from '../router';

export async function roundStartPage(root: HTMLElement): Promise<() => void> {
  const setup = await currentSetup({ preferCache: true });
  if (!setup) { navigate('#/'); return () => undefined; }
  const bundle = setup.data;
  const siteId = bundle.site.id;

  let surveyor = prefs.surveyor ?? '';
  // Default: the meter used last here, else the first one still in calibration.
  const nowIso = new Date().toISOString();
  const firstGood = (bundle.meters.find((m) => !isCalibrationOverdue(m.calibrationDue, nowIso)) ?? bundle.meters[0])?.id ?? null;
  let meterId = prefs.meterFor(siteId) ?? firstGood;
  if (meterId && !bundle.meters.some((m) => m.id === meterId)) meterId = firstGood;
  const vals: Record<'rh' | 'temp', string> = { rh: '', temp: '' };
  let tempNegative = false;
  let editing: 'rh' | 'temp' = 'rh';

  const surveyorList = h('div', { class: 'pick-row wrap' });
  const surveyorInput = h('input', { type: 'text', class: 'input-big', placeholder: 'Name', value: surveyor, autocomplete: 'off', 'aria-label': 'Surveyor name', dataset: { path: 'surveyor' } });
  surveyorInput.addEventListener('input', () => { surveyor = surveyorInput.value; renderSurveyors(); });
  const renderSurveyors = () => {
    replace(surveyorList, prefs.surveyors.map((n) => h('button', {
      type: 'button', class: `pick-btn${n === surveyor ? ' is-on' : ''}`, 'aria-pressed': String(n === surveyor),
      onclick: () => { surveyor = n; surveyorInput.value = n; renderSurveyors(); },
    }, n)));
  };

  const meterList = h('div', { class: 'pick-row wrap' });
  const renderMeters = () => {
    const now = new Date().toISOString();
    replace(meterList, bundle.meters.length === 0
      ? h('p', { class: 'error-box' }, 'No meter is set up for this site. Add one under Set-up → Meters.')
      : bundle.meters.map((m) => {
        const overdue = isCalibrationOverdue(m.calibrationDue, now);
        return h('button', {
          type: 'button', class: `pick-btn meter-btn${m.id === meterId ? ' is-on' : ''}`, 'aria-pressed': String(m.id === meterId),
          onclick: () => { meterId = m.id; renderMeters(); },
        }, h('span', null, m.label || m.serial), h('span', { class: overdue ? 'cal-overdue' : 'muted' },
          overdue ? `calibration overdue (due ${m.calibrationDue})` : `calibrated, due ${m.calibrationDue}`));
      }));
  };

  const rhBox = h('button', { type: 'button', class: 'num-field', dataset: { path: 'rhPercent', testid: 'rh' }, onclick: () => { editing = 'rh'; pad.set(vals.rh); renderNums(); } });
  const tempBox = h('button', { type: 'button', class: 'num-field', dataset: { path: 'temperatureC', testid: 'temp' }, onclick: () => { editing = 'temp'; pad.set(vals.temp); renderNums(); } });
  const tempSign = h('button', { type: 'button', class: 'btn pol-btn', 'aria-label': 'temperature sign: tap for below zero', onclick: () => { tempNegative = !tempNegative; renderNums(); } });
  const renderNums = () => {
    replace(rhBox, h('span', { class: 'num-label' }, 'RH'), h('span', { class: 'num-value' }, vals.rh || '—'), h('span', { class: 'num-unit' }, '%'));
    replace(tempBox, h('span', { class: 'num-label' }, 'Temp.'), h('span', { class: 'num-value' }, vals.temp ? `${tempNegative ? '−' : ''}${vals.temp}` : '—'), h('span', { class: 'num-unit' }, '°C'));
    rhBox.classList.toggle('is-editing', editing === 'rh');
    tempBox.classList.toggle('is-editing', editing === 'temp');
    tempSign.textContent = tempNegative ? '−' : '+';
    tempSign.setAttribute('aria-pressed', String(tempNegative));
  };
  const pad = numpad({ label: 'Number pad for RH and temperature', maxLength: 5, onChange: (v) => { vals[editing] = v; renderNums(); } });
  const unbind = pad.bindKeyboard();

  const form = h('form', { class: 'page round-start', novalidate: true },
    h('h1', null, 'Start a round'),
    h('div', { class: 'form-errors', hidden: true, role: 'alert' }),
    h('section', { class: 'card' },
      h('h2', null, 'Who walks'), surveyorList, surveyorInput,
      h('p', { class: 'field-error', dataset: { errorFor: 'surveyor' } })),
    h('section', { class: 'card' },
      h('h2', null, 'Air in the plant'),
      h('div', { class: 'ambient' },
        h('div', { class: 'stack' }, rhBox, h('p', { class: 'field-error', dataset: { errorFor: 'rhPercent' } }),
          h('div', { class: 'row gap' }, tempBox, tempSign), h('p', { class: 'field-error', dataset: { errorFor: 'temperatureC' } }),
          h('p', { class: 'muted' }, 'Tap RH or temperature, then type on the pad. Leave empty if not measured.')),
        pad.el)),
    h('section', { class: 'card' },
      h('h2', null, 'Meter'), meterList,
      h('p', { class: 'field-error', dataset: { errorFor: 'meterId' } })),
    h('div', { class: 'row gap sticky-actions' },
      h('button', { type: 'submit', class: 'btn btn-primary btn-big', dataset: { testid: 'start' } }, 'Start the round'),
      h('a', { class: 'btn btn-big', href: '#/' }, 'Cancel')),
  );

  form.addEventListener('submit', (ev) => {
    ev.preventDefault();
    void (async () => {
      const num = (s: string, neg = false) => (s === '' ? null : (neg ? -1 : 1) * Number(s));
      const input = {
        id: newId(), siteId, surveyor: surveyor.trim(), startedAt: new Date().toISOString(),
        rhPercent: num(vals.rh), temperatureC: num(vals.temp, tempNegative), notes: '',
        plannedSpotIds: routeOf(bundle).map((s) => s.id),
      };
      const parsed = RoundInputSchema.safeParse(input);
      const fields = parsed.success ? [] : zodFields(parsed.error);
      if (!meterId) fields.push({ path: 'meterId', message: 'pick the meter you carry' });
      if (fields.length) { showFieldErrors(form, fields); return; }
      try {
        const round = await startRound(input, meterId);
        prefs.rememberSurveyor(input.surveyor);
        if (meterId) prefs.setMeterFor(siteId, meterId);
        navigate(`#/round/${round.id}`);
      } catch (e) {
        if (e instanceof z.ZodError) showFieldErrors(form, zodFields(e));
        else showFieldErrors(form, [], `Could not save on this tablet: ${(e as Error).message}`);
      }
    })();
  });

  renderSurveyors(); renderMeters(); renderNums();
  root.append(form);
  return unbind;
}
