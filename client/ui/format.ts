/** Display helpers: dates in the tablet's locale, readings as entered. */
import { formatSi } from '../../core/units/format';

export function fmtDateTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return '—';
  return d.toLocaleString(undefined, { year: 'numeric', month: 'short', day: 'numeric', hour: '2-digit', minute: '2-digit' });
}

export function fmtTime(iso: string | null | undefined): string {
  if (!iso) return '—';
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return '—';
  return d.toLocaleTimeString(undefined, { hour: '2-digit', minute: '2-digit' });
}

export function fmtAsEntered(r: { value: number; unit: string; polarity: string }): string {
  const sign = r.polarity === '-' ? '−' : '+';
  return `${sign}${r.value} ${r.unit}`;
}

export function fmtField(vPerM: number | null | undefined): string {
  return formatSi(vPerM, 'V/m');
}

export function fmtDistance(d: { value: number; unit: string } | null | undefined): string {
  if (!d) return '—';
  return `${d.value} ${d.unit === 'inch' ? 'in' : d.unit}`;
}
