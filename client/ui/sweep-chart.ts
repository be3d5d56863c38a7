/**
 * The sweep plot: readings and each ranked model's fitted curve on log-log axes.
 * Imported dynamically by the sweep screen only, so chart.js (and only the parts
 * registered here) loads when that screen opens, not with the round screen.
 */
import {
  Chart, Legend, LineController, LineElement, LogarithmicScale, PointElement, ScatterController, Tooltip,
} from 'chart.js';

Chart.register(ScatterController, LineController, LogarithmicScale, PointElement, LineElement, Legend, Tooltip);

export interface SweepPlotData {
  /** Readings: x distance, y |field|, in the display units. */
  readings: { x: number; y: number }[];
  curves: { label: string; color: string; best: boolean; points: { x: number; y: number }[] }[];
  xLabel: string;
  yLabel: string;
}

/**
 * Draws (or redraws) the plot on the canvas; returns the chart to destroy later.
 * Animation is off: the picture is final as soon as this returns.
 */
export function drawSweepChart(canvas: HTMLCanvasElement, data: SweepPlotData, previous: Chart | null): Chart {
  previous?.destroy();
  const font = { size: 15, weight: 'bold' as const };
  return new Chart(canvas, {
    type: 'scatter',
    data: {
      datasets: [
        {
          type: 'scatter', label: 'Readings', data: data.readings, order: 0,
          backgroundColor: '#0b0f14', borderColor: '#0b0f14', pointRadius: 7, pointHoverRadius: 9, pointStyle: 'rectRot',
        },
        ...data.curves.map((c, i) => ({
          type: 'line' as const, label: c.label, data: c.points, order: i + 1,
          borderColor: c.color, backgroundColor: c.color, borderWidth: c.best ? 4 : 2,
          borderDash: c.best ? [] : [8, 5], pointRadius: 0, pointHoverRadius: 0, tension: 0,
        })),
      ],
    },
    options: {
      animation: false,
      responsive: true,
      maintainAspectRatio: false,
      parsing: false,
      normalized: true,
      scales: {
        x: { type: 'logarithmic', title: { display: true, text: data.xLabel, font, color: '#0b0f14' }, ticks: { color: '#0b0f14', font: { size: 13 } }, grid: { color: '#d3d9e0' } },
        y: { type: 'logarithmic', title: { display: true, text: data.yLabel, font, color: '#0b0f14' }, ticks: { color: '#0b0f14', font: { size: 13 } }, grid: { color: '#d3d9e0' } },
      },
      plugins: {
        legend: { position: 'bottom', labels: { color: '#0b0f14', font: { size: 14 }, boxWidth: 28, padding: 12 } },
        tooltip: { enabled: true },
      },
    },
  });
}
