/**
 * The substance picker: minimum ignition energies (MIE) and minimum ignition charges
 * with their published sources. Where two tables disagree the LOWER MIE is used
 * (the conservative one) and the other is kept in `mieAlternatives`.
 *
 * gasGroup here is the group for static-electricity purposes, from the MIE bands of
 * BG RCI ExInfo FAQ 8.G.1 Table 1 (IIA >= 0.20 mJ, IIB 0.02-0.20 mJ, IIC <= 0.02 mJ);
 * it can differ from the explosion group by gap (e.g. alcohols, see the FAQ).
 */
import { gasGroupForMie, type GasGroup } from './facts';

export interface Substance {
  id: string;
  name: string;
  /** Minimum ignition energy, J. */
  mieJ: number;
  mieSource: string;
  mieAlternatives: readonly { mieJ: number; source: string }[];
  /** Minimum ignition charge, C (PTB data), or null where not tabled. */
  minIgnitionChargeC: number | null;
  minIgnitionChargeSource: string | null;
  gasGroup: GasGroup;
  gasGroupSource: string;
}

const NFPA = 'NFPA 77 (2000) Table B.1';
const BGR = 'BGR 132 Annex G Table 14 (PTB data; carried on in TRGS 727)';
const GROUP_SOURCE = 'by MIE band, BG RCI ExInfo FAQ 8.G.1 Table 1';
const mJ = 1e-3;
const nC = 1e-9;

function s(id: string, name: string, mie: number, mieSource: string, qNc: number | null, alternatives: { mieJ: number; source: string }[] = []): Substance {
  return {
    id, name, mieJ: mie * mJ, mieSource, mieAlternatives: alternatives,
    minIgnitionChargeC: qNc === null ? null : qNc * nC,
    minIgnitionChargeSource: qNc === null ? null : BGR,
    gasGroup: gasGroupForMie(mie * mJ), gasGroupSource: GROUP_SOURCE,
  };
}

/** The picker list, most sensitive first. */
export const SUBSTANCES: readonly Substance[] = [
  s('carbon-disulfide', 'Carbon disulfide', 0.009, NFPA, null),
  s('hydrogen', 'Hydrogen', 0.016, 'NFPA 77 / NFPA 921 as quoted by public university tables (0.016-0.019 mJ)', 12),
  s('acetylene', 'Acetylene', 0.017, `${NFPA} (after Britton 1992)`, null),
  s('ethylene', 'Ethylene', 0.07, 'mine-gas handbook table (Advanced Mine Ventilation, Table 23.3)', 32, [{ mieJ: 0.082 * mJ, source: BGR }]),
  s('1-3-butadiene', '1,3-Butadiene', 0.13, NFPA, null),
  s('methanol', 'Methanol', 0.14, 'from memory (NFPA 77 Table B.1)', null),
  s('diethyl-ether', 'Diethyl ether', 0.19, 'from memory (NFPA 77 Table B.1)', 40),
  s('benzene', 'Benzene', 0.2, NFPA, 45),
  s('cyclohexane', 'Cyclohexane', 0.22, NFPA, null),
  s('ethanol', 'Ethanol', 0.23, 'from memory', null),
  s('toluene', 'Toluene', 0.24, 'from memory', null),
  s('n-hexane', 'n-Hexane', 0.24, 'from memory', 60),
  s('n-heptane', 'n-Heptane', 0.24, 'from memory (NFPA 77 Table B.1)', 60),
  s('ethane', 'Ethane', 0.24, 'from memory (NFPA 77 Table B.1)', 70),
  s('propane', 'Propane', 0.25, NFPA, 70),
  s('butane', 'Butane', 0.25, NFPA, 60),
  s('methyl-ethyl-ketone', 'Methyl ethyl ketone (MEK)', 0.27, BGR, null),
  s('n-pentane', 'n-Pentane', 0.28, 'from memory (NFPA 77 Table B.1)', 63),
  s('methane', 'Methane', 0.28, 'NFPA 921 as quoted; mine-gas handbook table (0.28-0.30 mJ)', 70),
  s('ethyl-acetate', 'Ethyl acetate', 0.46, BGR, 120),
  s('acetone', 'Acetone', 0.55, BGR, 127, [{ mieJ: 1.15 * mJ, source: NFPA }]),
  s('ammonia', 'Ammonia', 14, BGR, null, [{ mieJ: 680 * mJ, source: NFPA }]),
];

/**
 * Looks a substance up by id.
 * @example substanceById('propane')?.mieJ // 2.5e-4 J
 */
export function substanceById(id: string): Substance | undefined {
  return SUBSTANCES.find((x) => x.id === id);
}
