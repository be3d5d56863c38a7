/**
 * The substance picker of the area form: the substance table of core/hazard (MIE and
 * minimum ignition charge, each with its source) as select options.
 */
import { SUBSTANCES } from '../../../core/hazard/substances';

/** Options for the area's substance: none, every tabled substance, and an unknown current id kept as it is. */
export function substanceOptions(current: string | null | undefined): { value: string; label: string }[] {
  const opts = [
    { value: '', label: 'none (judge by the gas group; IIC when no group)' },
    ...SUBSTANCES.map((s) => ({
      value: s.id,
      label: `${s.name} · MIE ${+(s.mieJ * 1e3).toPrecision(3)} mJ (${s.mieSource})${s.minIgnitionChargeC !== null ? ` · min. ignition charge ${+(s.minIgnitionChargeC * 1e9).toPrecision(3)} nC (PTB data, BGR 132)` : ''} · ${s.gasGroup}`,
    })),
  ];
  if (current && !SUBSTANCES.some((s) => s.id === current)) opts.push({ value: current, label: `${current} (not in the table: the checks use the gas group)` });
  return opts;
}

export const SUBSTANCE_HINT = 'Optional: the most sensitive substance in the air here. Sets the MIE and minimum ignition charge of the hazard checks; each value names its source. Where tables disagree the lower MIE is used.';
