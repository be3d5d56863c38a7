/**
 * Readings: the batch ingest (issue 5: exactly once), one reading with its
 * history, corrections (new revisions) and tombstones.
 */
import { z } from 'zod';
import {
  CorrectionInputSchema, ReadingAcksSchema, ReadingBatchSchema, ReadingInputSchema, ReadingSchema,
  ReadingWithHistorySchema, TombstoneInputSchema, type ReadingInput,
} from '../../core/schemas';
import { fromStoreError, fromZodError, HttpError } from '../http/errors';
import { defineRoute, notFoundError, type Route } from '../http/route';
import { StoreError } from '../store/errors';

/** One reading or { readings: [...] }; whole-batch validation before anything is stored. */
function parseReadings(body: unknown): { inputs: ReadingInput[]; batch: boolean } {
  if (body === undefined) {
    throw new HttpError(400, 'invalid', 'a JSON body is required (Content-Type: application/json)', [{ path: '(body)', message: 'is required' }]);
  }
  const batch = typeof body === 'object' && body !== null && !Array.isArray(body) && 'readings' in body;
  if (batch) {
    const r = ReadingBatchSchema.safeParse(body);
    if (!r.success) throw fromZodError(r.error, 'the batch');
    return { inputs: r.data.readings, batch: true };
  }
  const r = ReadingInputSchema.safeParse(body);
  if (!r.success) throw fromZodError(r.error, 'the reading');
  return { inputs: [r.data], batch: false };
}

export const readingRoutes: Route[] = [
  defineRoute({
    method: 'post', path: '/readings', tag: 'readings', summary: 'Store one reading or a batch (exactly once)',
    description: 'Takes one ReadingInput or { readings: [...] } (at most 500). The whole batch is validated first: one bad reading '
      + 'answers 400 naming its path (readings.3.distance.value) and nothing is stored; an unknown round, spot or meter answers 404 '
      + 'naming readings.N.spotId and nothing is stored. Then one transaction, answered only after it committed, with one ack per '
      + 'reading: stored (new), duplicate (the same id and content was already stored: a harmless retry), conflict (the same id with '
      + 'other content: kept for review in /api/conflicts, never applied, never dropped). Readings of a retired spot are stored and '
      + 'flagged spot-retired.',
    bodyDoc: z.union([ReadingInputSchema, ReadingBatchSchema]),
    responses: { 200: { description: 'one ack per reading, in the order sent', schema: ReadingAcksSchema } },
    errors: [400, 404, 413, 415],
    handle: async ({ store, req }) => {
      const { inputs, batch } = parseReadings(req.body);
      try {
        return { body: { acks: await store.ingestReadings(inputs) } };
      } catch (e) {
        if (!(e instanceof StoreError)) throw e;
        // Store paths start with the index in the batch; a single reading has none.
        const fields = e.fields.map((f) => ({ ...f, path: batch ? ['readings', ...f.path] : f.path.slice(1) }));
        throw fromStoreError(new StoreError(e.code, e.message, fields));
      }
    },
  }),
  defineRoute({
    method: 'get', path: '/readings/:id', tag: 'readings', summary: 'A reading revision with its whole history', resource: 'reading',
    description: 'history: every revision of the reading, oldest first (the original and its corrections; deleted ones too).',
    responses: { 200: { description: 'the revision and its history', schema: ReadingWithHistorySchema } }, errors: [404],
    handle: async ({ store, id }) => {
      const found = await store.getReading(id);
      if (!found) throw notFoundError('reading', id);
      return { body: found };
    },
  }),
  defineRoute({
    method: 'post', path: '/readings/:id/corrections', tag: 'readings', summary: 'Correct a reading (a new revision)', resource: 'reading',
    body: CorrectionInputSchema,
    description: 'The correction is a new reading (new id) whose supersedesId is this one; the old revision stays visible with history=1. '
      + '201 when stored, 200 for an identical retry of the same correction, 409 when this revision is already superseded or deleted.',
    responses: {
      201: { description: 'the new revision', schema: ReadingSchema },
      200: { description: 'the same correction was already stored (a retry)', schema: ReadingSchema },
    },
    errors: [400, 404, 409, 413, 415],
    handle: async ({ store, id, body }) => {
      const { reading, created } = await store.correctReading(id, body);
      return { status: created ? 201 : 200, body: reading };
    },
  }),
  defineRoute({
    method: 'post', path: '/readings/:id/tombstone', tag: 'readings', summary: 'Delete a reading (a tombstone with a reason)', resource: 'reading',
    body: TombstoneInputSchema,
    description: 'The reading stays stored, marked deleted; lists leave it out unless history=1. 409 when already deleted or superseded.',
    responses: { 200: { description: 'the deleted revision', schema: ReadingSchema } }, errors: [400, 404, 409, 413, 415],
    handle: async ({ store, id, body }) => ({ body: await store.tombstoneReading(id, body.reason) }),
  }),
];
