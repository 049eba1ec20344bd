import express from 'express';
import request from 'supertest';
import { z } from 'zod';
import { describe, expect, it } from 'vitest';
import { createLogWriter } from '../../log-writer.ts';
import { channelInputSchema, createLoggerSchema } from '../../contract/loggers.ts';
import { boundsParamsSchema, createAlertRuleSchema } from '../../contract/alerts.ts';
import { errorHandler, zodToValidationError } from './error-handler.ts';
import { fieldRefusal } from '../../services/service-errors.ts';

/** The ZodError of parsing `input` with `schema` (the test fails if it parses). */
function zodError(schema: z.ZodType, input: unknown): z.ZodError {
  const result = schema.safeParse(input);
  if (result.success) throw new Error('expected the input to be refused');
  return result.error;
}

/** An app whose one route throws `err`, behind the error middleware. */
function throwing(err: unknown) {
  const app = express();
  app.use(express.json());
  app.post('/x', () => {
    throw err;
  });
  app.use(errorHandler(createLogWriter({ silent: true })));
  return app;
}

describe('zodToValidationError', () => {
  it("names the field with the route's label and keeps its key in fields", () => {
    const err = zodToValidationError(zodError(channelInputSchema, { key: 't1', label: 'Air', validMin: 10, validMax: 5 }), '/loggers/:loggerId/channels');
    expect(err.status).toBe(400);
    expect(err.code).toBe('invalid_input');
    expect(err.message).toBe('Highest valid value: must be above the lowest valid value.');
    expect(err.details).toEqual([{ field: 'validMax', label: 'Highest valid value', reason: 'must be above the lowest valid value' }]);
  });

  it('names a field inside a list with its position, counting from 1', () => {
    const err = zodToValidationError(
      zodError(createLoggerSchema, {
        name: 'Shed',
        timezone: 'UTC',
        expectedIntervalS: 60,
        channels: [
          { key: 'ok', label: 'A' },
          { key: '', label: 'B' },
        ],
      }),
      '/loggers',
    );
    expect(err.details).toEqual([{ field: 'channels.1.key', label: 'Channel key (2nd channel)', reason: expect.stringMatching(/^use 1 to 64 letters/) }]);
    expect(err.message).toMatch(/^Channel key \(2nd channel\): use 1 to 64 letters/);
  });

  it('gives plain reasons for checks without their own message (wrong type, missing field)', () => {
    const err = zodToValidationError(zodError(z.object({ name: z.string(), count: z.number() }), { count: 'three' }));
    expect(err.details).toEqual([
      { field: 'name', label: 'Name', reason: 'is required' },
      { field: 'count', label: 'Count', reason: 'must be a number' },
    ]);
    expect(err.message).toBe('Name: is required. Count: must be a number.');
  });

  it('lists each unknown field of a strict form under its own key, put in words', () => {
    const err = zodToValidationError(zodError(z.object({ a: z.string() }).strict(), { a: 'x', colourCode: 1 }));
    expect(err.details).toEqual([{ field: 'colourCode', label: 'Colour code', reason: 'is not a field of this form' }]);
  });

  it('names the kind as the missing field of a form that has none', () => {
    const err = zodToValidationError(zodError(createAlertRuleSchema, { name: 'Warm' }), '/alert-rules');
    expect(err.details).toEqual([{ field: 'kind', label: 'Kind of rule', reason: 'must be silence, bounds, rate or unusual' }]);
  });

  it('uses the alert rule labels for nested rule settings', () => {
    const err = zodToValidationError(zodError(z.object({ params: boundsParamsSchema }), { params: { low: 5, high: 2 } }), '/alert-rules');
    expect(err.message).toBe('Low limit: must be below the high limit.');
  });
});

describe('errorHandler', () => {
  it('answers a validation error with code, message and fields', async () => {
    const res = await request(throwing(fieldRefusal('key', 'Channel key', 'another channel of this logger has it')))
      .post('/x')
      .expect(400);
    expect(res.body).toEqual({
      error: {
        code: 'invalid_input',
        message: 'Channel key: another channel of this logger has it.',
        fields: [{ field: 'key', label: 'Channel key', reason: 'another channel of this logger has it' }],
      },
    });
  });

  it('answers a ZodError thrown by a handler the same way', async () => {
    const res = await request(throwing(zodError(z.object({ copies: z.number().max(366) }), { copies: 400 })))
      .post('/x')
      .expect(400);
    expect(res.body.error).toEqual({
      code: 'invalid_input',
      message: 'Copies: must be at most 366.',
      fields: [{ field: 'copies', label: 'Copies', reason: 'must be at most 366' }],
    });
  });

  it('answers unreadable JSON in plain words, without fields', async () => {
    const app = throwing(new Error('never reached'));
    const res = await request(app).post('/x').set('Content-Type', 'application/json').send('{"a":').expect(400);
    expect(res.body).toEqual({ error: { code: 'invalid_input', message: 'The request could not be read: it is not valid JSON.' } });
  });

  it('answers anything else 500 without internals', async () => {
    const res = await request(throwing(new TypeError('x.validMin is undefined')))
      .post('/x')
      .expect(500);
    expect(res.body).toEqual({ error: { code: 'internal', message: 'Something went wrong on our side.' } });
  });
});
