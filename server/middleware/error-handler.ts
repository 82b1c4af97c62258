import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { HttpError } from '../lib/errors';
import { isDatabaseUnavailable } from '../db/errors';
import { logger } from '../lib/logger';
import { zodFieldMessages } from './validate';

/** Seconds a client should wait before retrying while the database is unreachable. */
export const DB_RETRY_AFTER_SECONDS = 5;
/** body-parser error type of a JSON body refused by its shape (depth, element count) before parsing. */
export const JSON_SHAPE_ERROR = 'entity.shape';

/**
 * Only the engine's own input errors are a client's mistake: a RangeError thrown from a frame in
 * shared/engine. Any other RangeError (call stack exhausted, invalid date, array length) is a bug.
 */
export function isEngineInputError(err: unknown): err is RangeError {
  if (!(err instanceof RangeError) || typeof err.stack !== 'string') return false;
  const firstFrame = err.stack.split('\n').find((line) => /^\s+at /.test(line)) ?? '';
  return /[\\/]shared[\\/]engine[\\/]/.test(firstFrame);
}

export const notFoundHandler: RequestHandler = (_req, res) => {
  res.status(404).json({ error: { code: 'not_found', message: 'No such endpoint.' } });
};

/** Turns every thrown error into `{ error: { code, message, fields? } }`; never leaks a stack trace. */
export const errorHandler: ErrorRequestHandler = (err, req, res, _next) => {
  if (err instanceof HttpError) {
    res.status(err.status).json({ error: { ...err.extra, code: err.code, message: err.message, fields: err.fields } });
    return;
  }
  if (err instanceof ZodError) {
    res.status(400).json({ error: { code: 'invalid_input', message: 'Check the highlighted fields.', fields: zodFieldMessages(err) } });
    return;
  }
  if (err?.name === 'MulterError') {
    const tooLarge = err.code === 'LIMIT_FILE_SIZE';
    res.status(tooLarge ? 413 : 400).json({
      error: tooLarge
        ? { code: 'too_large', message: 'Files can be at most 10 MB.', fields: { file: 'Files can be at most 10 MB.' } }
        : { code: 'invalid_input', message: 'The upload is not in the expected form (one file in the field “file”).' },
    });
    return;
  }
  if (isEngineInputError(err)) {
    // The engine throws RangeError with a plain message for inputs outside a formula's validity.
    res.status(400).json({ error: { code: 'out_of_range', message: err.message } });
    return;
  }
  if (isDatabaseUnavailable(err)) {
    req.log?.warn({ err }, 'database unavailable');
    res.set('Retry-After', String(DB_RETRY_AFTER_SECONDS));
    res.status(503).json({ error: { code: 'unavailable', message: 'The database cannot be reached right now. Try again in a few seconds.' } });
    return;
  }
  const status = typeof err?.status === 'number' ? err.status : typeof err?.statusCode === 'number' ? err.statusCode : 500;
  if (err?.type === 'entity.too.large' || status === 413) {
    res.status(413).json({ error: { code: 'too_large', message: 'The request body is too large.' } });
    return;
  }
  if (err instanceof URIError) {
    // A malformed percent-escape in the path ("/api/tanks/%ff"): the address itself is wrong.
    res.status(400).json({ error: { code: 'bad_path', message: 'The address contains a malformed escape (%).' } });
    return;
  }
  if (err?.type === JSON_SHAPE_ERROR) {
    res.status(400).json({ error: { code: 'too_complex', message: String(err.message) } });
    return;
  }
  if (err?.type === 'entity.parse.failed' || (status === 400 && err?.expose)) {
    res.status(400).json({ error: { code: 'malformed', message: 'The request body is not valid JSON.' } });
    return;
  }
  if (status >= 400 && status < 500 && err?.expose) {
    res.status(status).json({ error: { code: 'bad_request', message: String(err.message ?? 'Bad request.') } });
    return;
  }
  // Anything else is our fault: logged with its stack, and the client sees only the generic message.
  (req.log ?? logger).error({ err, stack: err instanceof Error ? err.stack : undefined, method: req.method, url: req.originalUrl }, 'unhandled error');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side. Try again.' } });
};
