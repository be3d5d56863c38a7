/**
 * Zod schemas of the hazard answers: a hazard verdict (core/hazard/verdicts.ts), the
 * note that explains a missing estimate, and the substance table behind the area's
 * atmosphere picker (GET /api/substances). They document responses (OpenAPI) and type
 * the client; the values themselves come from core/hazard.
 */
import { z } from 'zod';

export const HazardVerdictSchema = z.object({
  check: z.string().describe('esd-field, esd-isolated-conductor, esd-body-voltage, spark-energy, brush-discharge, propagating-brush, ignition-charge, transfer-charge, shock-voltage, shock-hazard'),
  level: z.enum(['ok', 'warn', 'alarm', 'not-applicable']),
  compared: z.object({
    quantity: z.string(),
    value: z.number().describe('magnitude, SI'),
    unit: z.string(),
    threshold: z.number().describe('SI, same unit'),
  }).nullable().describe('The numbers compared; null when the check does not apply.'),
  reason: z.string(),
  source: z.string().describe("The threshold's source: standard and clause, 'common practice' or 'from memory'."),
  caution: z.string().describe("Defers to the site's safety standards, local codes and qualified people; says what was assumed."),
}).meta({ id: 'HazardVerdict', description: 'One screening check of an estimate against a sourced threshold.' });
export type HazardVerdict = z.infer<typeof HazardVerdictSchema>;

export const EstimateNoteSchema = z.object({
  code: z.string().describe('conductor-needs-potential, estimate-not-possible, unknown-substance'),
  message: z.string(),
}).meta({ id: 'EstimateNote', description: 'Why a reading has no estimate, or what its hazard checks assumed.' });

export const SubstanceSchema = z.object({
  id: z.string(),
  name: z.string(),
  mieJ: z.number().describe('Minimum ignition energy, J (the lower value where tables disagree).'),
  mieSource: z.string(),
  mieAlternatives: z.array(z.object({ mieJ: z.number(), source: z.string() })),
  minIgnitionChargeC: z.number().nullable().describe('Minimum ignition charge, C (PTB data), or null where not tabled.'),
  minIgnitionChargeSource: z.string().nullable(),
  gasGroup: z.enum(['IIA', 'IIB', 'IIC']).describe('Group for static-electricity purposes, by MIE band.'),
  gasGroupSource: z.string(),
}).meta({ id: 'Substance' });
export const SubstanceListSchema = z.object({ substances: z.array(SubstanceSchema) }).meta({ id: 'SubstanceList' });
