// Each kind of refusal a service can throw answers with its one HTTP status and the API's error
// shape, through the real error handler on a real HTTP server. Statuses as RFC 9110 §15 defines
// them (400, 401, 403, 404, 409, 415, 429 from RFC 6585, 502, 503); 402 is "reserved for future
// use" there and is what card services answer for a declined card (common practice).
import express from 'express';
import request from 'supertest';
import { describe, expect, it } from 'vitest';
import {
  conflict,
  declined,
  fieldsNeedFixing,
  forbidden,
  notFound,
  notSetUp,
  tooMany,
  unauthenticated,
  unsupported,
  upstreamFailed,
  type DomainError,
} from '@server/domain-errors';
import { errorHandler } from '@server/errors';

function appThrowing(error: DomainError) {
  const app = express();
  app.get('/x', () => {
    throw error;
  });
  app.use(errorHandler);
  return app;
}

describe('a service refusal over HTTP', () => {
  const cases: [DomainError, number, string][] = [
    [fieldsNeedFixing([{ path: 'pin', message: 'Four digits' }]), 400, 'validation_failed'],
    [unsupported('Not a photo'), 415, 'validation_failed'],
    [unauthenticated('That PIN is not right'), 401, 'unauthenticated'],
    [forbidden('Only a lead may'), 403, 'forbidden'],
    [notFound('Order'), 404, 'not_found'],
    [conflict('Already bumped'), 409, 'conflict'],
    [conflict('Tickets are open', [], 'open_tickets'), 409, 'open_tickets'],
    [declined('Card declined'), 402, 'payment_declined'],
    [tooMany('Too many wrong PINs'), 429, 'rate_limited'],
    [upstreamFailed('The card service did not answer'), 502, 'payment_unavailable'],
    [notSetUp('Card payments are not set up here'), 503, 'unavailable'],
  ];
  it.each(cases)('%s → %i %s', async (error, status, code) => {
    const res = await request(appThrowing(error)).get('/x');
    expect(res.status).toBe(status);
    expect(res.body.error).toMatchObject({ code, message: error.message });
    if (error.details !== undefined) expect(res.body.error.details).toEqual(error.details);
  });
});
