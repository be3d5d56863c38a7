/**
 * The estimation engine over HTTP (issue 3): POST /api/estimate (one reading, one
 * model), POST /api/sweep (readings at several distances) and GET /api/substances
 * (the atmosphere picker's table, every value with its source). Pure core/ functions:
 * nothing is stored. Bad input answers 400 naming the field; never 5xx.
 */
import { z } from 'zod';
import { SUBSTANCES } from '../../core/hazard/substances';
import { estimate } from '../../core/physics/estimate';
import { sweep } from '../../core/physics/sweep';
import {
  EstimateRequestSchema, EstimateResponseSchema, SweepRequestSchema, SweepResponseSchema,
  type EstimateRequest, type SweepRequest,
} from '../../core/schemas/estimate';
import { SubstanceListSchema } from '../../core/schemas/hazard';
import { fromZodError, HttpError } from '../http/errors';
import { defineRoute, type Route } from '../http/route';

/**
 * A RangeError from the physics (input outside a model's domain) as a 400. The field
 * is taken from the message when it names one ("geometry.radiusM must ..."), else the body.
 */
function rangeToHttp(e: RangeError, fallbackPath: string): HttpError {
  const m = /\b((?:geometry\.)?[a-z][A-Za-z]*(?:M|V|F|PerM|Rel|Factor|Permittivity))\b/.exec(e.message);
  const path = m?.[1] ?? fallbackPath;
  return new HttpError(400, 'invalid', `the request body is not valid: ${e.message}`, [{ path, message: e.message }]);
}

function run<T>(f: () => T, fallbackPath: string): T {
  try {
    return f();
  } catch (e) {
    if (e instanceof z.ZodError) throw fromZodError(e);
    if (e instanceof RangeError) throw rangeToHttp(e, fallbackPath);
    throw e;
  }
}

export const estimateRoutes: Route[] = [
  defineRoute({
    method: 'post', path: '/estimate', tag: 'estimate', summary: 'Interpret one reading with one model: charge, densities, potential, energy, with intervals',
    description: 'distanceM is from the meter to the charge for point, dipole-axis, dipole-broadside and image-charge, and the gap to the surface for every other model. '
      + 'For conductor give potentialV (V) instead of fieldVPerM. A quantity the model does not define is null. The numbers are equivalent charges for an idealised '
      + 'geometry, not a measured charge: read the warnings. Nothing is stored.',
    body: EstimateRequestSchema,
    responses: { 200: { description: 'the estimate with a 95 % interval on every quantity, the interval method and validity warnings', schema: EstimateResponseSchema } },
    errors: [400],
    handle: async ({ body }) => ({ body: run(() => estimate(body as EstimateRequest), 'model') }),
  }),
  defineRoute({
    method: 'post', path: '/sweep', tag: 'estimate', summary: 'Fit readings of one object at three or more distances: fall-off exponent, ranked models, charge',
    description: 'distanceM is the gap from the meter to the object\'s surface. Every candidate model is fitted on ln |E| (charge plus at most one depth), '
      + 'ranked by AICc; the answer names the chosen model with a charge interval, the residuals and a conclusion in words. Nothing is stored.',
    body: SweepRequestSchema,
    responses: { 200: { description: 'exponent with its standard error, the chosen model, the ranking, residuals, conclusion and warnings', schema: SweepResponseSchema } },
    errors: [400],
    handle: async ({ body }) => ({ body: run(() => sweep(body as SweepRequest), 'readings') }),
  }),
  defineRoute({
    method: 'get', path: '/substances', tag: 'estimate', summary: 'Substances for an area\'s atmosphere: MIE and minimum ignition charge, with sources',
    description: 'Most sensitive first. Where two tables disagree the lower MIE is used and the other is listed in mieAlternatives. '
      + 'gasGroup is the group for static-electricity purposes (by MIE band), which can differ from the explosion group.',
    responses: { 200: { description: 'the substance table', schema: SubstanceListSchema } },
    errors: [],
    handle: async () => ({ body: { substances: SUBSTANCES } }),
  }),
];
