/**
 * #/labels: a printable sheet of spot labels: the QR code (the app URL
 * .../#/scan/<CODE>, so the tablet's scanner and any phone camera open it), the
 * code in large type and the spot name. The QR SVG comes from the server and is
 * shown through <img src="data:image/svg+xml,..."> (never parsed into the page);
 * when the server gives none, the qrcode package draws it here.
 */
import { h, replace } from '../ui/h';
import { errorText } from '../api';
import { currentSetup } from '../app';
import { navigate } from '../router';
import { loadLabels, type Label } from '../review-api';

export function scanUrlFor(code: string): string {
  return `${location.origin}${location.pathname}#/scan/${encodeURIComponent(code)}`;
}

async function qrSrc(l: Label): Promise<string> {
  if (l.qrSvg && l.qrSvg.trimStart().startsWith('<')) return `data:image/svg+xml;charset=utf-8,${encodeURIComponent(l.qrSvg)}`;
  const QR = await import('qrcode');
  return QR.toDataURL(l.url, { errorCorrectionLevel: 'M', margin: 2, width: 320 });
}

export async function labelsPage(root: HTMLElement): Promise<void> {
  const setup = await currentSetup({ preferCache: true });
  if (!setup) { navigate('#/'); return; }
  const b = setup.data;
  const page = h('div', { class: 'page labels-page' }, h('p', { class: 'muted' }, 'Loading labels…'));
  root.append(page);
  let labels: Label[];
  let note = '';
  try {
    labels = await loadLabels(b.site.id);
  } catch (e) {
    // Offline (or an older server): the same labels from the set-up on this tablet.
    note = `Labels made on this tablet (${errorText(e)}).`;
    labels = b.spots.filter((s) => !s.retiredAt).sort((x, y) => x.routePosition - y.routePosition).map((s) => ({
      spotId: s.id, code: s.code, name: s.name, areaId: s.areaId, areaName: b.areas.find((a) => a.id === s.areaId)?.name ?? '', url: scanUrlFor(s.code),
    }));
  }
  let area = '';
  const grid = h('div', { class: 'label-grid', dataset: { testid: 'label-grid' } });
  const filter = h('div', { class: 'seg seg-wrap no-print', role: 'radiogroup', 'aria-label': 'Area' });
  const areas = [...new Set(labels.map((l) => l.areaName ?? ''))].filter(Boolean);

  const render = async () => {
    replace(filter, [['', 'All areas'], ...areas.map((a) => [a, a])].map(([v, label]) => h('button', {
      type: 'button', class: `seg-btn${v === area ? ' is-on' : ''}`, role: 'radio', 'aria-checked': String(v === area),
      onclick: () => { area = v!; void render(); },
    }, label!)));
    const shown = labels.filter((l) => !area || l.areaName === area);
    const cards = await Promise.all(shown.map(async (l) => {
      const src = await qrSrc(l).catch(() => '');
      return h('figure', { class: 'label-card', dataset: { code: l.code, spotId: l.spotId } },
        src ? h('img', { class: 'label-qr', src, alt: `QR code for ${l.code}: ${l.url}`, width: '160', height: '160' }) : h('p', { class: 'error-text' }, 'no QR'),
        h('figcaption', null,
          h('span', { class: 'label-code' }, l.code),
          h('span', { class: 'label-name' }, l.name),
          l.areaName ? h('span', { class: 'label-area' }, l.areaName) : null));
    }));
    replace(grid, cards.length ? cards : h('p', { class: 'muted' }, 'No spots.'));
  };

  replace(page,
    h('div', { class: 'row between wrap gap no-print' },
      h('div', null, h('p', { class: 'eyebrow' }, b.site.name), h('h1', null, 'Spot labels')),
      h('div', { class: 'row gap wrap' },
        h('button', { type: 'button', class: 'btn btn-primary', dataset: { testid: 'print-labels' }, onclick: () => window.print() }, 'Print labels'),
        h('a', { class: 'btn', href: '#/scan' }, 'Scan'),
        h('a', { class: 'btn', href: '#/' }, 'Home'))),
    h('p', { class: 'muted no-print' }, 'Each label opens its spot in the round when scanned (with the tablet\'s Scan screen or any phone camera). Print on A4 or Letter; cut along the borders; laminate for the floor.'),
    note ? h('p', { class: 'muted no-print' }, note) : null,
    filter, grid);
  await render();
}
