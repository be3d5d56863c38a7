/**
 * Floor plans of the invented demo plant: one simple SVG drawing per area, drawn
 * here (our own invention, no outside image), with every demo spot placed next to
 * the equipment it stands for, so the plan screen shows pins out of the box.
 *
 * Drawing units: a 1000 x 700 viewBox; positions are stored as fractions of it
 * (x from the left, y from the top), as PUT /api/spots/:id/position takes them.
 */
import type { AreaKey } from './plant';

const W = 1000;
const H = 700;

interface Box { label: string; x: number; y: number; w: number; h: number; round?: boolean }
interface DemoPlan { title: string; boxes: Box[]; doors: { x: number; y: number; w: number; h: number }[]; spots: Record<string, [number, number]> }

const PLANS: Record<AreaKey, DemoPlan> = {
  hall: {
    title: 'Film converting hall (zone 1, solvent inks)',
    boxes: [
      { label: 'Unwind', x: 70, y: 200, w: 110, h: 150 },
      { label: 'Printer 2, units 1-6', x: 240, y: 200, w: 300, h: 150 },
      { label: 'Dryer', x: 560, y: 200, w: 140, h: 150 },
      { label: 'Rewind', x: 760, y: 200, w: 120, h: 150 },
      { label: 'Ink store', x: 70, y: 470, w: 230, h: 150 },
      { label: 'Slitter', x: 560, y: 470, w: 200, h: 130 },
      { label: 'Edge trim', x: 800, y: 480, w: 110, h: 110 },
    ],
    doors: [{ x: 440, y: 680, w: 120, h: 20 }],
    spots: {
      'C-01': [125, 150], 'C-02': [210, 380], 'C-03': [470, 150], 'C-04': [720, 380], 'C-05': [820, 150],
      'C-06': [130, 440], 'C-07': [240, 440], 'C-08': [520, 540], 'C-09': [900, 380], 'C-10': [855, 450],
    },
  },
  powder: {
    title: 'Powder filling room (zone 22)',
    boxes: [
      { label: 'Big-bag station', x: 80, y: 90, w: 220, h: 200 },
      { label: 'Hopper', x: 380, y: 110, w: 160, h: 160, round: true },
      { label: 'Filling head', x: 620, y: 120, w: 180, h: 150 },
      { label: 'Pallet', x: 640, y: 430, w: 200, h: 160 },
      { label: 'Sampling bench', x: 80, y: 450, w: 240, h: 110 },
    ],
    doors: [{ x: 980, y: 300, w: 20, h: 120 }],
    spots: {
      'P-01': [190, 330], 'P-02': [460, 320], 'P-03': [710, 320], 'P-04': [560, 380], 'P-05': [740, 620],
      'P-06': [860, 200], 'P-07': [200, 600],
    },
  },
  epa: {
    title: 'Electronics sub-assembly EPA',
    boxes: [
      { label: 'Soldering 1', x: 80, y: 80, w: 220, h: 110 },
      { label: 'Soldering 2', x: 380, y: 80, w: 220, h: 110 },
      { label: 'Reel store', x: 700, y: 80, w: 220, h: 160 },
      { label: 'Tote rack', x: 80, y: 320, w: 160, h: 200 },
      { label: 'Packing bench', x: 380, y: 440, w: 240, h: 110 },
      { label: 'Inspection bench', x: 700, y: 440, w: 220, h: 110 },
    ],
    doors: [{ x: 0, y: 580, w: 20, h: 100 }],
    spots: {
      'E-01': [190, 230], 'E-02': [490, 230], 'E-03': [810, 290], 'E-04': [280, 420], 'E-05': [500, 400],
      'E-06': [760, 600], 'E-07': [880, 600],
    },
  },
  general: {
    title: 'Dispatch and goods-in',
    boxes: [
      { label: 'Stretch wrapper', x: 140, y: 160, w: 220, h: 220, round: true },
      { label: 'Racking', x: 480, y: 80, w: 440, h: 90 },
      { label: 'Racking', x: 480, y: 260, w: 440, h: 90 },
    ],
    doors: [{ x: 600, y: 680, w: 240, h: 20 }],
    spots: { 'G-01': [250, 430], 'G-02': [720, 610] },
  },
};

/**
 * The SVG drawing of a demo area: walls, equipment with its name, doors, a title.
 * Only plain drawing elements (it passes the upload sanitizer unchanged in effect).
 * @example demoPlanSvg('hall').startsWith('<svg') // true
 */
export function demoPlanSvg(area: AreaKey): string {
  const p = PLANS[area];
  const parts: string[] = [
    `<svg xmlns="http://www.w3.org/2000/svg" viewBox="0 0 ${W} ${H}" width="${W}" height="${H}">`,
    `<rect x="0" y="0" width="${W}" height="${H}" fill="#fbfaf7"/>`,
    `<rect x="10" y="10" width="${W - 20}" height="${H - 20}" fill="none" stroke="#333" stroke-width="12"/>`,
  ];
  for (const d of p.doors) parts.push(`<rect x="${d.x}" y="${d.y}" width="${d.w}" height="${d.h}" fill="#fbfaf7"/>`);
  for (const b of p.boxes) {
    parts.push(b.round
      ? `<ellipse cx="${b.x + b.w / 2}" cy="${b.y + b.h / 2}" rx="${b.w / 2}" ry="${b.h / 2}" fill="#e4e9ef" stroke="#556" stroke-width="3"/>`
      : `<rect x="${b.x}" y="${b.y}" width="${b.w}" height="${b.h}" rx="6" fill="#e4e9ef" stroke="#556" stroke-width="3"/>`);
    parts.push(`<text x="${b.x + b.w / 2}" y="${b.y + b.h / 2 + 8}" text-anchor="middle" font-family="sans-serif" font-size="24" fill="#223">${b.label}</text>`);
  }
  parts.push(`<text x="30" y="${H - 30}" font-family="sans-serif" font-size="22" fill="#555">${p.title} (invented demo plan)</text>`);
  parts.push('</svg>');
  return parts.join('');
}

/**
 * Where each demo spot of an area stands on its plan, as fractions of the drawing.
 * @example demoSpotPositions('general')['G-01'] // { x: 0.25, y: 0.614... }
 */
export function demoSpotPositions(area: AreaKey): Record<string, { x: number; y: number }> {
  const out: Record<string, { x: number; y: number }> = {};
  for (const [code, [x, y]] of Object.entries(PLANS[area].spots)) out[code] = { x: x / W, y: y / H };
  return out;
}
