/**
 * The spot trend chart: |field| over time with the warn and alarm bands filled,
 * readings as points coloured AND shaped by verdict (OK circle, WARN triangle,
 * ALARM diamond), the Theil–Sen line, and relative humidity on a second axis.
 * A second, smaller chart shows the estimated charge where the spot has a model.
 *
 * Imported dynamically by the spot screen only. The time axis is a LinearScale
 * over epoch ms with our own tick labels (no date adapter needed).
 */
import {
  Chart, Filler, Legend, LinearScale, LineController, LineElement, LogarithmicScale, PointElement, ScatterController, Tooltip,
  type ChartDataset, type TooltipItem,
} from 'chart.js';
import { formatSi } from '../../core/units/format';

Chart.register(LineController, ScatterController, LinearScale, LogarithmicScale, PointElement, LineElement, Filler, Legend, Tooltip);

export interface TrendChartPoint {
  t: number;
  /** Signed field, V/m (the chart plots the magnitude; the tooltip keeps the sign). */
  fieldVPerM: number;
  level: 'ok' | 'warn' | 'alarm';
  rh: number | null;
  chargeC: number | null;
  /** Estimated surface charge density, C/m^2 (plotted when the model gives no charge: sheet, layer on ground). */
  sigma?: number | null;
}

export interface TrendChartData {
  points: TrendChartPoint[];
  warn: number | null;
  alarm: number | null;
  /** Theil–Sen line: level (V/m) at centreMs and slope per ms. */
  trendLine: { centreMs: number; level: number; slopePerMs: number } | null;
  fromMs: number;
  toMs: number;
  log: boolean;
}

const INK = '#0b0f14';
const COLORS = { ok: '#0b6e2f', warn: '#b07d00', alarm: '#b3001b' } as const;
const STYLES = { ok: 'circle', warn: 'triangle', alarm: 'rectRot' } as const;
const LABEL = { ok: 'OK', warn: 'WARN', alarm: 'ALARM' } as const;
const DAY = 86_400_000;

function dateTick(ms: number, spanMs: number): string {
  const d = new Date(ms);
  if (spanMs > 400 * DAY) return d.toLocaleDateString(undefined, { month: 'short', year: '2-digit' });
  return d.toLocaleDateString(undefined, { day: 'numeric', month: 'short' });
}

/** Picks kV/m or V/m for the axis so the numbers stay short. */
function fieldScale(max: number): { div: number; unit: string } {
  return max >= 2000 ? { div: 1000, unit: 'kV/m' } : { div: 1, unit: 'V/m' };
}

function chargeScale(max: number): { div: number; unit: string } {
  if (max >= 1e-6) return { div: 1e-6, unit: 'µC' };
  if (max >= 1e-9) return { div: 1e-9, unit: 'nC' };
  return { div: 1e-12, unit: 'pC' };
}

const font = { size: 14, weight: 'bold' as const };
const tickFont = { size: 13 };

export function drawTrendChart(canvas: HTMLCanvasElement, d: TrendChartData, previous: Chart | null): Chart {
  previous?.destroy();
  const maxField = Math.max(d.alarm ?? 0, d.warn ?? 0, ...d.points.map((p) => Math.abs(p.fieldVPerM)).filter(Number.isFinite), 1);
  const fs = fieldScale(maxField);
  const span = Math.max(d.toMs - d.fromMs, DAY);
  const top = maxField * (d.log ? 3 : 1.15) / fs.div;
  const floorLog = Math.max(1e-3, Math.min(...d.points.map((p) => Math.abs(p.fieldVPerM) / fs.div).filter((v) => v > 0), (d.warn ?? maxField) / fs.div) / 3);

  const datasets: ChartDataset<'line' | 'scatter', { x: number; y: number }[]>[] = [];
  if (d.alarm !== null && Number.isFinite(d.alarm)) {
    datasets.push({
      type: 'line', label: `ALARM level ${formatSi(d.alarm, 'V/m')}`, data: [{ x: d.fromMs, y: d.alarm / fs.div }, { x: d.toMs, y: d.alarm / fs.div }],
      borderColor: COLORS.alarm, borderWidth: 2, borderDash: [10, 4], pointRadius: 0, pointHoverRadius: 0, pointStyle: 'line',
      backgroundColor: 'rgba(179, 0, 27, 0.12)', fill: 'end', order: 10, yAxisID: 'y',
    });
  }
  if (d.warn !== null && Number.isFinite(d.warn)) {
    datasets.push({
      type: 'line', label: `WARN level ${formatSi(d.warn, 'V/m')}`, data: [{ x: d.fromMs, y: d.warn / fs.div }, { x: d.toMs, y: d.warn / fs.div }],
      borderColor: COLORS.warn, borderWidth: 2, borderDash: [4, 4], pointRadius: 0, pointHoverRadius: 0, pointStyle: 'line',
      backgroundColor: 'rgba(255, 179, 0, 0.18)', fill: d.alarm !== null ? { value: d.alarm / fs.div } : 'end', order: 11, yAxisID: 'y',
    });
  }
  for (const level of ['ok', 'warn', 'alarm'] as const) {
    const pts = d.points.filter((p) => p.level === level && Number.isFinite(p.fieldVPerM));
    if (!pts.length) continue;
    datasets.push({
      type: 'scatter', label: `${LABEL[level]} reading (${pts.length})`,
      data: pts.map((p) => ({ x: p.t, y: Math.max(Math.abs(p.fieldVPerM) / fs.div, d.log ? floorLog : 0), signed: p.fieldVPerM, rh: p.rh })),
      backgroundColor: COLORS[level], borderColor: level === 'warn' ? '#3d2800' : '#fff', borderWidth: 1.5,
      pointStyle: STYLES[level], pointRadius: level === 'ok' ? 5 : 7, pointHoverRadius: 9, order: 1, yAxisID: 'y',
    });
  }
  if (d.trendLine) {
    const f = (t: number) => (d.trendLine!.level + d.trendLine!.slopePerMs * (t - d.trendLine!.centreMs)) / fs.div;
    const a = d.points.length ? Math.min(...d.points.map((p) => p.t)) : d.fromMs;
    const b = d.points.length ? Math.max(...d.points.map((p) => p.t)) : d.toMs;
    datasets.push({
      type: 'line', label: 'Trend (Theil–Sen)', data: [{ x: a, y: f(a) }, { x: b, y: f(b) }].map((p) => ({ x: p.x, y: d.log ? Math.max(p.y, floorLog) : Math.max(p.y, 0) })),
      borderColor: INK, borderWidth: 3, pointRadius: 0, pointHoverRadius: 0, pointStyle: 'line', order: 2, yAxisID: 'y',
    });
  }
  const rhPts = d.points.filter((p) => p.rh !== null && Number.isFinite(p.rh)).sort((a, b) => a.t - b.t);
  if (rhPts.length) {
    datasets.push({
      type: 'line', label: 'RH %', data: rhPts.map((p) => ({ x: p.t, y: p.rh! })),
      borderColor: '#1f5fbf', backgroundColor: '#1f5fbf', borderWidth: 2, borderDash: [2, 3], pointRadius: 2, pointStyle: 'line', order: 3, yAxisID: 'rh',
    });
  }

  return new Chart(canvas, {
    type: 'scatter',
    data: { datasets: datasets as ChartDataset<'scatter', { x: number; y: number }[]>[] },
    options: {
      animation: false, responsive: true, maintainAspectRatio: false, parsing: false, normalized: true,
      interaction: { mode: 'nearest', intersect: true },
      scales: {
        x: {
          type: 'linear', min: d.fromMs, max: d.toMs,
          ticks: { color: INK, font: tickFont, maxTicksLimit: 7, callback: (v) => dateTick(Number(v), span) },
          grid: { color: '#e0e4ea' },
        },
        y: {
          type: d.log ? 'logarithmic' : 'linear', position: 'left', min: d.log ? floorLog : 0, suggestedMax: top,
          title: { display: true, text: `|field| at the meter, ${fs.unit}${d.log ? ' (log)' : ''}`, font, color: INK },
          ticks: { color: INK, font: tickFont, maxTicksLimit: 8, callback: (v) => formatTick(Number(v)) }, grid: { color: '#d3d9e0' },
        },
        rh: {
          type: 'linear', position: 'right', min: 0, max: 100, display: rhPts.length > 0,
          title: { display: true, text: 'RH %', font, color: '#1f5fbf' },
          ticks: { color: '#1f5fbf', font: tickFont, stepSize: 20 }, grid: { drawOnChartArea: false },
        },
      },
      plugins: {
        legend: { position: 'bottom', labels: { color: INK, font: { size: 13 }, usePointStyle: true, padding: 12 } },
        tooltip: {
          filter: (it) => it.dataset.type === 'scatter' || it.dataset.label === 'RH %',
          callbacks: {
            title: (items) => (items[0] ? new Date(items[0].parsed.x ?? 0).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' }) : ''),
            label: (it: TooltipItem<'scatter'>) => {
              const raw = it.raw as { signed?: number; rh?: number | null };
              if (it.dataset.label === 'RH %') return `RH ${it.parsed.y} %`;
              return `${it.dataset.label?.split(' ')[0] ?? ''} ${formatSi(raw.signed ?? 0, 'V/m')} (polarity ${((raw.signed ?? 0) < 0) ? '−' : '+'})${raw.rh !== null && raw.rh !== undefined ? `, RH ${raw.rh} %` : ''}`;
            },
          },
        },
      },
    },
  });
}

function formatTick(v: number): string {
  if (!Number.isFinite(v)) return '';
  if (v === 0) return '0';
  const a = Math.abs(v);
  return a >= 100 ? v.toFixed(0) : a >= 10 ? v.toFixed(0) : a >= 1 ? v.toFixed(1).replace(/\.0$/, '') : String(Number(v.toPrecision(2)));
}

/** The estimated charge (magnitude) on its own axis, with the same time range. */
export function drawChargeChart(canvas: HTMLCanvasElement, d: TrendChartData, previous: Chart | null, quantity: 'charge' | 'sigma' = 'charge'): Chart {
  previous?.destroy();
  const valueOf = (p: TrendChartPoint): number | null => (quantity === 'charge' ? p.chargeC : p.sigma ?? null);
  const unit = quantity === 'charge' ? 'C' : 'C/m²';
  const pts = d.points.filter((p) => { const v = valueOf(p); return v !== null && Number.isFinite(v); }).map((p) => ({ ...p, chargeC: valueOf(p) }));
  const base = chargeScale(Math.max(...pts.map((p) => Math.abs(p.chargeC!)), 1e-12));
  const cs = quantity === 'charge' ? base : { div: base.div, unit: `${base.unit}/m²` };
  const span = Math.max(d.toMs - d.fromMs, DAY);
  const datasets = (['ok', 'warn', 'alarm'] as const).map((level) => ({
    type: 'scatter' as const, label: `${LABEL[level]}`,
    data: pts.filter((p) => p.level === level).map((p) => ({ x: p.t, y: Math.abs(p.chargeC!) / cs.div, signed: p.chargeC })),
    backgroundColor: COLORS[level], borderColor: level === 'warn' ? '#3d2800' : '#fff', borderWidth: 1.5,
    pointStyle: STYLES[level], pointRadius: level === 'ok' ? 4 : 6,
  })).filter((ds) => ds.data.length);
  return new Chart(canvas, {
    type: 'scatter',
    data: { datasets },
    options: {
      animation: false, responsive: true, maintainAspectRatio: false, parsing: false,
      scales: {
        x: { type: 'linear', min: d.fromMs, max: d.toMs, ticks: { color: INK, font: tickFont, maxTicksLimit: 7, callback: (v) => dateTick(Number(v), span) }, grid: { color: '#e0e4ea' } },
        y: { type: 'linear', min: 0, title: { display: true, text: quantity === 'charge' ? `|estimated charge|, ${cs.unit}` : `|σ|, ${cs.unit}`, font, color: INK }, ticks: { color: INK, font: tickFont, maxTicksLimit: 6 }, grid: { color: '#d3d9e0' } },
      },
      plugins: {
        legend: { display: false },
        tooltip: {
          callbacks: {
            title: (items) => (items[0] ? new Date(items[0].parsed.x ?? 0).toLocaleString(undefined, { dateStyle: 'medium', timeStyle: 'short' }) : ''),
            label: (it) => `${it.dataset.label ?? ''} ${formatSi((it.raw as { signed?: number }).signed ?? 0, unit)}`,
          },
        },
      },
    },
  });
}
