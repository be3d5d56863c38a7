import { z } from 'zod';
import { DISTANCE_UNITS } from '../units/distance';
import { READING_UNITS } from '../units/field';

/** Plain-language messages: the client shows them beside the field, the API returns them with the path. */
export const finite = (what: string) =>
  z.number({ error: (iss) => (iss.input === undefined ? `${what} is required` : `${what} must be a number`) })
    .refine(Number.isFinite, { message: `${what} must be a finite number` });

export const Id = z.uuid({ error: 'must be a UUID' });
export const IdV7 = z.uuid({ version: 'v7', error: 'must be a time-ordered UUID (version 7)' });

export const text = (what: string, max: number) =>
  z.string({ error: `${what} must be text` }).trim().max(max, `${what} must be at most ${max} characters`);
export const requiredText = (what: string, max: number) =>
  text(what, max).min(1, `${what} is required`);

export const IsoDateTime = z.iso.datetime({ offset: true, error: 'must be a date and time in ISO 8601 form, e.g. 2026-03-02T09:15:00Z' });
export const IsoDate = z.iso.date({ error: 'must be a date as YYYY-MM-DD' });

export const DistanceUnitSchema = z.enum(DISTANCE_UNITS, { error: `unit must be one of ${DISTANCE_UNITS.join(', ')}` });
export const ReadingUnitSchema = z.enum(READING_UNITS, { error: `unit must be one of ${READING_UNITS.join(', ')}` });

/** A distance as entered, with its unit kept beside it. */
export const DistanceSchema = z.object({
  value: finite('distance').refine((v) => v > 0, 'distance must be greater than zero').refine((v) => v <= 1e5, 'distance is too large'),
  unit: DistanceUnitSchema,
}).meta({ id: 'Distance', description: 'A distance as entered: value and unit (mm, cm, m, inch).' });
export type Distance = z.infer<typeof DistanceSchema>;

export const RhPercent = finite('relative humidity').refine((v) => v >= 0 && v <= 100, 'relative humidity must be between 0 and 100 %');
export const TemperatureC = finite('temperature').refine((v) => v >= -50 && v <= 80, 'temperature must be between -50 and 80 °C');

/** The one error envelope of every 4xx/5xx answer. */
export const ErrorEnvelopeSchema = z.object({
  error: z.object({
    code: z.string(),
    message: z.string(),
    fields: z.array(z.object({ path: z.string(), message: z.string() })).optional(),
  }),
}).meta({ id: 'Error' });
export type ErrorEnvelope = z.infer<typeof ErrorEnvelopeSchema>;

/** Turns a zod error into the fields list: dotted paths ("readings.3.distance.value") and messages. */
export function issuesToFields(error: z.ZodError): { path: string; message: string }[] {
  return error.issues.map((i) => ({
    path: i.path.length ? i.path.map(String).join('.') : '(body)',
    message: i.message,
  }));
}
