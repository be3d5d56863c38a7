/**
 * Floor plans. #/plans lists the site's areas; #/plan/:areaId shows an area's
 * plan image (as <img>: an SVG plan can never run script there) with a pin per
 * placed spot at its fractional position, labelled with the spot code AND the
 * verdict word of its latest reading, coloured by it.
 *
 * Pins are placed and moved by dragging (pointer events: mouse, pen and touch,
 * with pointer capture); an unplaced spot can be dragged from the list onto the
 * plan, or tapped and then placed with a tap on the plan. A tap on a pin without
 * dragging opens the spot. Each move is saved at once (PUT /api/spots/:id/position):
 * plans are set-up, done with a network.
 */
import { h, replace } from '../ui/h';
import { confirmSheet, toast } from '../ui/sheet';
import { VERDICT_LABEL } from '../ui/verdict';
import { fmtDateTime } from '../ui/format';
import { api, apiUpload, errorText } from '../api';
import { currentSetup } from '../app';
import { navigate } from '../router';
import { loadPins, planUrl, setPosition } from '../review-api';
import type { VerdictLevel } from '../../core/limits';
import { MAX_PLAN_IMAGE_BYTES } from '../../core/plan/image-type';
import { AREA_KIND_LABEL } from '../../core/schemas';

const DRAG_THRESHOLD_PX = 8;

/** A pin as the screen moves it: position as two numbers (null: not on the plan). */
interface Pin { spotId: string; code: string; name: string; x: number | null; y: number | null; level: VerdictLevel | null; lastTakenAt: string | null }

export async function plansPage(root: HTMLElement): Promise<void> {
  const setup = await currentSetup({ preferCache: true });
  if (!setup) { navigate('#/'); return; }
  const b = setup.data;
  root.append(h('div', { class: 'page plans-page' },
    h('div', { class: 'row between wrap' }, h('h1', null, 'Floor plans'), h('a', { class: 'btn', href: '#/' }, 'Home')),
    h('p', { class: 'muted' }, 'Pick an area to upload its plan and place its spots.'),
    h('ul', { class: 'list card' }, b.areas.map((a) => h('li', null,
      h('a', { class: 'list-link', href: `#/plan/${a.id}`, dataset: { testid: 'plan-area' } },
        h('span', { class: 'grow' }, a.name), h('span', { class: 'muted' }, AREA_KIND_LABEL[a.kind]),
        h('span', { class: 'muted' }, `${b.spots.filter((s) => s.areaId === a.id && !s.retiredAt).length} spots`)))))));
}

function typeOf(file: File): string {
  if (file.type) return file.type;
  const ext = file.name.toLowerCase().split('.').pop();
  return ext === 'png' ? 'image/png' : ext === 'jpg' || ext === 'jpeg' ? 'image/jpeg' : ext === 'svg' ? 'image/svg+xml' : 'application/octet-stream';
}

function removedOf(r: unknown): string[] {
  const o = (r ?? {}) as Record<string, unknown>;
  const cands = [o.removed, (o.sanitizer as Record<string, unknown> | undefined)?.removed, (o.plan as Record<string, unknown> | undefined)?.removed, o.warnings];
  for (const c of cands) if (Array.isArray(c)) return c.map(String);
  return [];
}

export async function planPage(root: HTMLElement, params: Record<string, string>): Promise<() => void> {
  const areaId = params.areaId!;
  const setup = await currentSetup({ preferCache: true });
  if (!setup) { navigate('#/'); return () => undefined; }
  const bundle = setup.data;
  const area = bundle.areas.find((a) => a.id === areaId);
  const page = h('div', { class: 'page plan-page' });
  root.append(page);
  if (!area) { replace(page, h('p', { class: 'error-box' }, 'This area is not in the set-up on this tablet.'), h('a', { class: 'btn', href: '#/plans' }, 'Floor plans')); return () => undefined; }

  let pins: Pin[] = [];
  let version = Date.now();
  let hasPlan = false;
  let armed: Pin | null = null;
  const disposers: (() => void)[] = [];

  const fileIn = h('input', { type: 'file', accept: 'image/png,image/jpeg,image/svg+xml,.png,.jpg,.jpeg,.svg', class: 'file-input', dataset: { testid: 'plan-file' }, 'aria-label': 'Plan image file' });
  const uploadMsg = h('div', { class: 'upload-msg', dataset: { testid: 'plan-message' }, 'aria-live': 'polite' });
  const img = h('img', { class: 'plan-img', alt: `Floor plan of ${area.name}`, draggable: 'false' });
  const pinLayer = h('div', { class: 'pin-layer' });
  const stage = h('div', { class: 'plan-stage', dataset: { testid: 'plan-stage' } }, img, pinLayer);
  const noPlan = h('p', { class: 'muted no-plan' }, 'No plan uploaded for this area yet.');
  const hint = h('p', { class: 'plan-hint', 'aria-live': 'polite' });
  const unplacedEl = h('div', { class: 'unplaced', dataset: { testid: 'unplaced' } });
  const placedEl = h('div', { class: 'placed' });
  const removeBtn = h('button', { type: 'button', class: 'btn btn-danger-outline', hidden: true, onclick: () => void removePlan() }, 'Remove plan');

  replace(page,
    h('div', { class: 'row between wrap gap' },
      h('div', null, h('p', { class: 'eyebrow' }, AREA_KIND_LABEL[area.kind]), h('h1', null, `Plan: ${area.name}`)),
      h('div', { class: 'row gap wrap no-print' }, h('a', { class: 'btn', href: '#/plans' }, 'All plans'), h('a', { class: 'btn', href: '#/' }, 'Home'))),
    h('section', { class: 'card no-print' },
      h('h2', null, 'Plan image'),
      h('p', { class: 'muted' }, `PNG, JPEG or SVG, at most ${Math.round(MAX_PLAN_IMAGE_BYTES / 1024 / 1024)} MB. SVG files are made safe on upload (no scripts, no outside references).`),
      h('div', { class: 'row gap wrap' }, h('label', { class: 'btn btn-primary file-btn' }, 'Upload a plan…', fileIn), removeBtn),
      uploadMsg),
    h('div', { class: 'plan-layout' },
      h('section', { class: 'plan-main' }, noPlan, stage, hint),
      h('aside', { class: 'card plan-side' },
        h('h2', null, 'Not on the plan'),
        h('p', { class: 'muted' }, 'Drag a spot onto the plan, or tap it and then tap the plan.'),
        unplacedEl,
        h('h2', null, 'On the plan'),
        placedEl)));

  fileIn.addEventListener('change', () => void upload());

  async function upload(): Promise<void> {
    const file = fileIn.files?.[0];
    fileIn.value = '';
    if (!file) return;
    replace(uploadMsg);
    if (file.size > MAX_PLAN_IMAGE_BYTES) {
      replace(uploadMsg, h('p', { class: 'error-box' }, `${file.name} is ${(file.size / 1024 / 1024).toFixed(1)} MB; a plan may be at most ${Math.round(MAX_PLAN_IMAGE_BYTES / 1024 / 1024)} MB. Export it smaller (a PNG of about 2000 px across is plenty).`));
      return;
    }
    replace(uploadMsg, h('p', { class: 'muted' }, `Uploading ${file.name}…`));
    try {
      const r = await apiUpload<unknown>('PUT', `/api/areas/${encodeURIComponent(areaId)}/plan`, file, typeOf(file));
      const removed = removedOf(r);
      replace(uploadMsg,
        h('p', { class: 'banner banner-ok' }, `Plan uploaded: ${file.name}`),
        removed.length ? h('div', { class: 'banner banner-info', dataset: { testid: 'plan-removed' } },
          h('p', null, 'Removed from the SVG to make it safe:'), h('ul', null, removed.map((x) => h('li', null, x)))) : null);
      version = Date.now();
      showImage();
    } catch (e) {
      replace(uploadMsg, h('p', { class: 'error-box', dataset: { testid: 'plan-error' } }, `Not uploaded: ${errorText(e)}`));
    }
  }

  async function removePlan(): Promise<void> {
    if (!await confirmSheet('Remove the plan', 'The plan image is removed; the spots keep their positions for the next plan.', 'Remove plan', true)) return;
    try {
      await api('DELETE', `/api/areas/${encodeURIComponent(areaId)}/plan`);
      hasPlan = false; version = Date.now(); showImage();
    } catch (e) { toast(`Not removed: ${errorText(e)}`, 'error'); }
  }

  function showImage(): void {
    img.onload = () => { hasPlan = true; stage.hidden = false; noPlan.hidden = true; removeBtn.hidden = false; renderPins(); };
    img.onerror = () => { hasPlan = false; stage.hidden = true; noPlan.hidden = false; removeBtn.hidden = true; renderLists(); };
    img.src = planUrl(areaId, version);
  }

  async function loadAll(): Promise<void> {
    try {
      const r = await loadPins(areaId);
      pins = r.pins.map((p) => ({
        spotId: p.spotId, code: p.code, name: p.name, x: p.position?.x ?? null, y: p.position?.y ?? null,
        level: p.latest?.level ?? null, lastTakenAt: p.latest?.takenAt ?? null,
      }));
      if (!r.plan) { hasPlan = false; stage.hidden = true; noPlan.hidden = false; removeBtn.hidden = true; }
    } catch (e) {
      replace(hint, h('span', { class: 'error-text' }, `Pins not loaded: ${errorText(e)}`));
      pins = [];
    }
    // Spots of the area the pins answer left out (none expected) still show in the list.
    for (const s of bundle.spots) {
      if (s.areaId === areaId && !s.retiredAt && !pins.some((p) => p.spotId === s.id)) pins.push({ spotId: s.id, code: s.code, name: s.name, x: null, y: null, level: null, lastTakenAt: null });
    }
    renderPins();
  }

  const placed = (p: Pin) => p.x !== null && p.y !== null && Number.isFinite(p.x) && Number.isFinite(p.y);

  function pinLabel(p: Pin): string {
    return `${p.code} ${p.level ? VERDICT_LABEL[p.level] : 'none'}`;
  }

  function renderPins(): void {
    replace(pinLayer, hasPlan ? pins.filter(placed).map((p) => pinEl(p)) : null);
    renderLists();
  }

  function renderLists(): void {
    const un = pins.filter((p) => !placed(p));
    replace(unplacedEl, un.length === 0 ? h('p', { class: 'muted' }, 'Every spot is on the plan.') : un.map((p) => unplacedEl_(p)));
    const on = pins.filter(placed);
    replace(placedEl, on.length === 0 ? h('p', { class: 'muted' }, 'None yet.') : h('ul', { class: 'list' }, on.map((p) => h('li', { class: 'list-row' },
      h('a', { class: 'grow', href: `#/spot/${p.spotId}` }, h('span', { class: 'code' }, p.code), ` ${p.name}`),
      h('button', { type: 'button', class: 'btn btn-small', onclick: () => void save(p, null) }, 'Take off')))));
    hint.textContent = armed ? `Now tap the plan where ${armed.code} is.` : '';
  }

  function levelClass(p: Pin): string { return p.level ? `verdict-${p.level}` : 'pin-none'; }

  function pinEl(p: Pin): HTMLElement {
    const el = h('button', {
      type: 'button', class: `pin ${levelClass(p)}`, dataset: { spotId: p.spotId, code: p.code, level: p.level ?? 'none' },
      title: `${p.code} ${p.name}${p.lastTakenAt ? ` · last reading ${fmtDateTime(p.lastTakenAt)}` : ''}`,
      'aria-label': `${p.code} ${p.name}: ${p.level ? VERDICT_LABEL[p.level] : 'no reading'}. Drag to move, tap to open.`,
    }, h('span', { class: 'pin-code' }, p.code), h('span', { class: 'pin-verdict' }, p.level ? VERDICT_LABEL[p.level] : 'none'));
    place(el, p.x!, p.y!);
    dragPin(el, p);
    return el;
  }

  function place(el: HTMLElement, x: number, y: number): void {
    el.style.left = `${(x * 100).toFixed(3)}%`;
    el.style.top = `${(y * 100).toFixed(3)}%`;
  }

  /** Fraction of the image under a client point, clamped to 0..1; null when outside. */
  function fractionAt(cx: number, cy: number, clamp: boolean): { x: number; y: number } | null {
    const r = img.getBoundingClientRect();
    if (r.width === 0 || r.height === 0) return null;
    let x = (cx - r.left) / r.width;
    let y = (cy - r.top) / r.height;
    if (!clamp && (x < 0 || x > 1 || y < 0 || y > 1)) return null;
    x = Math.min(1, Math.max(0, x));
    y = Math.min(1, Math.max(0, y));
    return { x: Math.round(x * 10000) / 10000, y: Math.round(y * 10000) / 10000 };
  }

  function dragPin(el: HTMLElement, p: Pin): void {
    let start: { x: number; y: number; id: number } | null = null;
    let moved = false;
    el.addEventListener('pointerdown', (e) => {
      if (e.button !== 0) return;
      e.preventDefault();
      start = { x: e.clientX, y: e.clientY, id: e.pointerId };
      moved = false;
      el.setPointerCapture(e.pointerId);
      el.classList.add('is-grabbed');
    });
    el.addEventListener('pointermove', (e) => {
      if (!start || e.pointerId !== start.id) return;
      if (!moved && Math.hypot(e.clientX - start.x, e.clientY - start.y) < DRAG_THRESHOLD_PX) return;
      moved = true;
      const f = fractionAt(e.clientX, e.clientY, true);
      if (f) place(el, f.x, f.y);
    });
    const end = (e: PointerEvent, cancelled: boolean) => {
      if (!start || e.pointerId !== start.id) return;
      start = null;
      el.classList.remove('is-grabbed');
      if (cancelled) { place(el, p.x!, p.y!); return; }
      if (!moved) { navigate(`#/spot/${p.spotId}`); return; }
      const f = fractionAt(e.clientX, e.clientY, true);
      if (f) void save(p, f);
    };
    el.addEventListener('pointerup', (e) => end(e, false));
    el.addEventListener('pointercancel', (e) => end(e, true));
    // Keyboard: Enter opens the spot (a click without a pointer).
    el.addEventListener('click', (e) => { if (e.detail === 0) navigate(`#/spot/${p.spotId}`); });
  }

  function unplacedEl_(p: Pin): HTMLElement {
    const el = h('button', {
      type: 'button', class: `unplaced-item${armed?.spotId === p.spotId ? ' is-armed' : ''}`, dataset: { spotId: p.spotId, testid: 'unplaced-item' },
      'aria-pressed': String(armed?.spotId === p.spotId),
    }, h('span', { class: `pin pin-static ${levelClass(p)}` }, h('span', { class: 'pin-code' }, p.code), h('span', { class: 'pin-verdict' }, p.level ? VERDICT_LABEL[p.level] : 'none')),
    h('span', { class: 'unplaced-name' }, p.name));
    let start: { x: number; y: number; id: number } | null = null;
    let ghost: HTMLElement | null = null;
    el.addEventListener('pointerdown', (e) => {
      if (e.button !== 0) return;
      if (!hasPlan) { toast('Upload a plan first, then place the spots on it', 'warn'); return; }
      e.preventDefault();
      start = { x: e.clientX, y: e.clientY, id: e.pointerId };
      el.setPointerCapture(e.pointerId);
    });
    el.addEventListener('pointermove', (e) => {
      if (!start || e.pointerId !== start.id) return;
      if (!ghost && Math.hypot(e.clientX - start.x, e.clientY - start.y) < DRAG_THRESHOLD_PX) return;
      if (!ghost) {
        ghost = h('span', { class: `pin pin-ghost ${levelClass(p)}` }, h('span', { class: 'pin-code' }, pinLabel(p)));
        document.body.append(ghost);
      }
      ghost.style.left = `${e.clientX}px`;
      ghost.style.top = `${e.clientY}px`;
    });
    const end = (e: PointerEvent, cancelled: boolean) => {
      if (!start || e.pointerId !== start.id) return;
      start = null;
      const wasDrag = !!ghost;
      ghost?.remove();
      ghost = null;
      if (cancelled) return;
      if (wasDrag) {
        const f = fractionAt(e.clientX, e.clientY, false);
        if (f) void save(p, f); else toast('Dropped outside the plan: not placed', 'warn');
        return;
      }
      armed = armed?.spotId === p.spotId ? null : p; // a tap arms it for a tap on the plan
      renderLists();
    };
    el.addEventListener('pointerup', (e) => end(e, false));
    el.addEventListener('pointercancel', (e) => end(e, true));
    el.addEventListener('click', (e) => {
      if (e.detail !== 0) return; // keyboard only
      if (!hasPlan) { toast('Upload a plan first', 'warn'); return; }
      armed = armed?.spotId === p.spotId ? null : p; renderLists();
    });
    return el;
  }

  // A tap on the plan places the armed spot.
  img.addEventListener('pointerup', (e) => {
    if (!armed) return;
    const f = fractionAt(e.clientX, e.clientY, false);
    if (!f) return;
    const p = armed;
    armed = null;
    void save(p, f);
  });

  async function save(p: Pin, f: { x: number; y: number } | null): Promise<void> {
    const old = { x: p.x, y: p.y };
    p.x = f?.x ?? null;
    p.y = f?.y ?? null;
    renderPins();
    try {
      await setPosition(p.spotId, f);
      toast(f ? `${p.code} placed` : `${p.code} taken off the plan`);
    } catch (e) {
      p.x = old.x; p.y = old.y;
      renderPins();
      toast(`Not saved: ${errorText(e)}`, 'error');
    }
  }

  stage.hidden = true;
  showImage();
  await loadAll();
  return () => { for (const d of disposers) d(); };
}
