/**
 * The metrics a limit set can bound. All values are SI magnitudes; polarity is
 * kept on the reading, limits compare |value| (limits judge magnitudes; the sign stays on the reading).
 */
export const LIMIT_METRICS = [
  'fieldVPerM',
  'surfaceVoltageV',
  'chargeC',
  'surfaceChargeDensityCPerM2',
  'energyJ',
  'bodyVoltageV',
] as const;
export type LimitMetric = (typeof LIMIT_METRICS)[number];

/** Plain names and SI units for display. */
export const LIMIT_METRIC_INFO: Readonly<Record<LimitMetric, { label: string; unit: string }>> = {
  fieldVPerM: { label: 'Field at the meter', unit: 'V/m' },
  surfaceVoltageV: { label: 'Surface voltage (meter display)', unit: 'V' },
  chargeC: { label: 'Estimated charge', unit: 'C' },
  surfaceChargeDensityCPerM2: { label: 'Surface charge density', unit: 'C/m²' },
  energyJ: { label: 'Stored energy', unit: 'J' },
  bodyVoltageV: { label: 'Body voltage', unit: 'V' },
};
