/**
 * Formats SI numbers for people: engineering prefixes, three significant figures.
 * Display code must never crash on a bad value: non-finite input gives an em dash.
 */
const PREFIXES: ReadonlyArray<[number, string]> = [
  [1e9, 'G'], [1e6, 'M'], [1e3, 'k'], [1, ''], [1e-3, 'm'], [1e-6, 'µ'], [1e-9, 'n'], [1e-12, 'p'], [1e-15, 'f'],
];

/**
 * @example formatSi(4921.26, 'V/m') // '4.92 kV/m'
 * @example formatSi(-1.2e-8, 'C') // '−12.0 nC'
 */
export function formatSi(value: number | null | undefined, unit: string, digits = 3): string {
  if (value === null || value === undefined || !Number.isFinite(value)) return '—';
  if (value === 0) return `0 ${unit}`;
  const abs = Math.abs(value);
  let chosen: [number, string] = PREFIXES[PREFIXES.length - 1]!;
  for (const p of PREFIXES) {
    if (abs >= p[0] * 0.9995) { chosen = p; break; }
  }
  // Compound units like V/m take the prefix on the numerator only.
  const scaled = value / chosen[0];
  const text = formatSignificant(scaled, digits);
  return `${text} ${chosen[1]}${unit}`;
}

/** Three significant figures without exponent notation for ordinary magnitudes. */
export function formatSignificant(value: number, digits = 3): string {
  if (!Number.isFinite(value)) return '—';
  if (value === 0) return '0';
  // Round first, so 0.9996 becomes 1.00 and not 1.000.
  const abs = Number(Math.abs(value).toPrecision(digits));
  const decimals = Math.max(0, digits - 1 - Math.floor(Math.log10(abs)));
  const s = abs.toFixed(Math.min(decimals, 12));
  return value < 0 ? `−${s}` : s;
}
