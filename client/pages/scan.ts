/**
 * #/scan: read a spot label with the tablet's camera and open that spot in the
 * round that is open on this tablet (or the spot screen when none is), so the
 * reading is bound to the place it was taken. #/scan/:code does the same for a
 * code given in the URL (the labels encode .../#/scan/CODE, so a phone's own
 * camera app opens the right screen too).
 *
 * Frames are decoded with the browser's BarcodeDetector where there is one, else
 * with jsQR on a canvas. No camera, a refused permission or a page not served
 * over HTTPS each get a plain message; typing the code always works.
 */
import { h, replace } from '../ui/h';
import { errorText } from '../api';
import { api } from '../api';
import { currentSetup } from '../app';
import { roundsOfSite } from '../data';
import { navigate } from '../router';
import type { SetupBundle, Spot } from '../../core/schemas';

const CODE_RE = /^[A-Za-z0-9][A-Za-z0-9-]{0,15}$/;

/** The spot code a label's text carries: '.../#/scan/C-04' or just 'C-04'; null when neither. */
export function codeFromText(text: string): string | null {
  const t = text.trim();
  const m = /#\/scan\/([^/?#\s]+)/.exec(t);
  if (m) { try { return decodeURIComponent(m[1]!); } catch { return m[1]!; } }
  return CODE_RE.test(t) ? t : null;
}

interface Detector { detect(source: CanvasImageSource): Promise<{ rawValue: string }[]> }
interface DetectorCtor { new (opts: { formats: string[] }): Detector; getSupportedFormats?: () => Promise<string[]> }

async function makeDetector(): Promise<((v: HTMLVideoElement, c: HTMLCanvasElement) => Promise<string | null>)> {
  const BD = (globalThis as unknown as { BarcodeDetector?: DetectorCtor }).BarcodeDetector;
  if (BD) {
    try {
      const formats = BD.getSupportedFormats ? await BD.getSupportedFormats() : ['qr_code'];
      if (formats.includes('qr_code')) {
        const d = new BD({ formats: ['qr_code'] });
        return async (v) => (await d.detect(v))[0]?.rawValue ?? null;
      }
    } catch { /* fall back to jsQR */ }
  }
  const { default: jsQR } = await import('jsqr');
  return async (v, c) => {
    const w = v.videoWidth; const hgt = v.videoHeight;
    if (!w || !hgt) return null;
    const scale = Math.min(1, 720 / Math.max(w, hgt));
    c.width = Math.round(w * scale); c.height = Math.round(hgt * scale);
    const ctx = c.getContext('2d', { willReadFrequently: true });
    if (!ctx) return null;
    ctx.drawImage(v, 0, 0, c.width, c.height);
    const img = ctx.getImageData(0, 0, c.width, c.height);
    return jsQR(img.data, img.width, img.height, { inversionAttempts: 'dontInvert' })?.data ?? null;
  };
}

function cameraProblem(e: unknown): string {
  const name = (e as { name?: string }).name ?? '';
  if (name === 'NotAllowedError' || name === 'SecurityError') return 'The camera permission was refused. Allow the camera for this site in the browser settings, or type the code below.';
  if (name === 'NotFoundError' || name === 'OverconstrainedError') return 'No camera found on this device. Type the code below.';
  if (name === 'NotReadableError') return 'The camera is in use by another app. Close it and try again, or type the code below.';
  return `The camera could not start (${(e as Error).message || name}). Type the code below.`;
}

export async function scanPage(root: HTMLElement, params: Record<string, string>): Promise<() => void> {
  const page = h('div', { class: 'page scan-page' });
  root.append(page);
  const setup = await currentSetup({ preferCache: true });
  if (!setup) { navigate('#/'); return () => undefined; }
  const bundle = setup.data;
  let alive = true;
  let stream: MediaStream | null = null;
  let timer: ReturnType<typeof setTimeout> | null = null;

  const stop = () => {
    if (timer) clearTimeout(timer);
    timer = null;
    for (const t of stream?.getTracks() ?? []) t.stop();
    stream = null;
    box.hidden = true;
  };

  const status = h('p', { class: 'scan-status', dataset: { testid: 'scan-status' }, 'aria-live': 'polite' });
  const video = h('video', { class: 'scan-video', playsinline: true, muted: true, autoplay: true, 'aria-label': 'Camera view' });
  const canvas = h('canvas', { class: 'scan-canvas', hidden: true });
  const codeIn = h('input', { type: 'text', class: 'input-big', placeholder: 'Code on the label, e.g. C-04', autocapitalize: 'characters', autocomplete: 'off', maxlength: 64, 'aria-label': 'Spot code', dataset: { testid: 'scan-code' } });
  const box = h('div', { class: 'scan-box', hidden: true }, video, canvas);
  const startBtn = h('button', { type: 'button', class: 'btn btn-primary btn-big', dataset: { testid: 'scan-start' }, onclick: () => void start() }, 'Start the camera');

  async function resolve(text: string): Promise<void> {
    const code = codeFromText(text);
    if (!code) { status.textContent = `"${text.slice(0, 80)}" is not a chargewalk label.`; status.className = 'scan-status error-text'; return; }
    const spot = await findSpot(bundle, code);
    if (!alive) return;
    if (!spot) { status.textContent = `No spot with the code ${code} at ${bundle.site.name}.`; status.className = 'scan-status error-text'; return; }
    stop();
    const open = (await roundsOfSite(bundle.site.id)).find((r) => !r.endedAt);
    navigate(open ? `#/round/${open.id}?spot=${encodeURIComponent(spot.id)}` : `#/spot/${spot.id}`);
  }

  async function start(): Promise<void> {
    if (!navigator.mediaDevices?.getUserMedia) {
      status.textContent = window.isSecureContext
        ? 'This browser gives no camera access. Type the code below.'
        : 'The camera works only when the app is opened over HTTPS (or on this device as localhost). Type the code below, or scan the label with the tablet\'s own camera app.';
      status.className = 'scan-status error-box';
      return;
    }
    try {
      stream = await navigator.mediaDevices.getUserMedia({ video: { facingMode: 'environment' }, audio: false });
    } catch (e) {
      status.textContent = cameraProblem(e);
      status.className = 'scan-status error-box';
      return;
    }
    if (!alive) { stop(); return; }
    box.hidden = false;
    video.srcObject = stream;
    await video.play().catch(() => undefined);
    startBtn.hidden = true;
    status.textContent = 'Point the camera at the label.';
    status.className = 'scan-status';
    const detect = await makeDetector();
    const tick = async () => {
      if (!alive || !stream) return;
      try {
        const text = await detect(video, canvas);
        if (text) { await resolve(text); if (!stream) return; }
      } catch { /* a frame that could not be read: try the next */ }
      timer = setTimeout(() => void tick(), 200);
    };
    void tick();
  }

  replace(page,
    h('div', { class: 'row between wrap gap' }, h('h1', null, 'Scan a spot label'), h('a', { class: 'btn', href: '#/' }, 'Home')),
    status,
    h('form', {
      class: 'row gap scan-manual', onsubmit: (e: Event) => { e.preventDefault(); if (codeIn.value.trim()) void resolve(codeIn.value.trim()); },
    }, codeIn, h('button', { type: 'submit', class: 'btn btn-primary', dataset: { testid: 'scan-open' } }, 'Open')),
    box,
    startBtn);

  if (params.code) {
    status.textContent = `Looking up ${params.code}…`;
    await resolve(params.code);
  } else {
    void start();
  }
  return () => { alive = false; stop(); };
}

async function findSpot(bundle: SetupBundle, code: string): Promise<Pick<Spot, 'id'> | null> {
  const local = bundle.spots.find((s) => s.code.toLowerCase() === code.toLowerCase() && !s.retiredAt)
    ?? bundle.spots.find((s) => s.code.toLowerCase() === code.toLowerCase());
  if (local) return local;
  try {
    const r = await api<{ id: string } | { spot: { id: string } }>('GET', `/api/spots/by-code/${encodeURIComponent(code)}?siteId=${encodeURIComponent(bundle.site.id)}`);
    return 'spot' in r ? r.spot : r;
  } catch (e) {
    console.warn(errorText(e));
    return null;
  }
}
