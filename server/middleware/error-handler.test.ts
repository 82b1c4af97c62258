// @vitest-environment node
import express from 'express';
import type { AddressInfo } from 'node:net';
import { describe, expect, it } from 'vitest';
import { convert } from '../../shared/engine';
import { errorHandler, isEngineInputError } from './error-handler';
import { parseOrThrow } from './validate';
import { z } from 'zod';

function engineError(): unknown {
  try {
    convert(1, 'bar', 'L');
  } catch (error) {
    return error;
  }
  throw new Error('the engine accepted bar → L');
}

describe('only the engine’s own input errors are a 400', () => {
  it('a RangeError thrown by the engine is an engine input error', () => {
    expect(isEngineInputError(engineError())).toBe(true);
  });

  it('any other RangeError (stack exhausted, invalid date) is not', () => {
    const overflow = (() => {
      const f = (n: number): number => f(n + 1) + 1;
      try {
        return f(0);
      } catch (error) {
        return error;
      }
    })();
    expect(overflow).toBeInstanceOf(RangeError);
    expect(isEngineInputError(overflow)).toBe(false);
    expect(isEngineInputError((() => { try { new Date(NaN).toISOString(); } catch (e) { return e; } })())).toBe(false);
  });

  it('answers a non-engine RangeError with 500 and the generic message only', async () => {
    const app = express();
    app.get('/boom', () => {
      throw new RangeError('Maximum call stack size exceeded');
    });
    app.get('/engine', () => {
      throw engineError();
    });
    app.use(errorHandler);
    const server = app.listen(0, '127.0.0.1');
    await new Promise((r) => server.once('listening', r));
    try {
      const base = `http://127.0.0.1:${(server.address() as AddressInfo).port}`;
      const boom = await fetch(`${base}/boom`);
      expect(boom.status).toBe(500);
      const text = await boom.text();
      expect(JSON.parse(text).error).toEqual({ code: 'internal', message: 'Something went wrong on our side. Try again.' });
      expect(text).not.toMatch(/Maximum call stack/);
      const engine = await fetch(`${base}/engine`);
      expect(engine.status).toBe(400);
      expect((await engine.json()).error.code).toBe('out_of_range');
    } finally {
      server.close();
    }
  });
});

describe('the validation error path is iterative', () => {
  it('a value nested 100 000 levels deep is walked without overflowing the stack', () => {
    let deep: unknown = 'x\u0000';
    for (let i = 0; i < 100_000; i += 1) deep = [deep];
    let thrown: unknown;
    try {
      parseOrThrow(z.object({}), deep);
    } catch (error) {
      thrown = error;
    }
    expect(thrown).toMatchObject({ status: 400 });
    expect(Object.values((thrown as { fields: Record<string, string> }).fields)[0]).toMatch(/NUL/);
  });
});
