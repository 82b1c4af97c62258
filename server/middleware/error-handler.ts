import type { ErrorRequestHandler, RequestHandler } from 'express';
import { ZodError } from 'zod';
import { HttpError } from '../lib/errors';
import { zodFieldMessages } from './validate';

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
  if (err instanceof RangeError) {
    // The engine throws RangeError with a plain message for inputs outside a formula's validity.
    res.status(400).json({ error: { code: 'out_of_range', message: err.message } });
    return;
  }
  const status = typeof err?.status === 'number' ? err.status : typeof err?.statusCode === 'number' ? err.statusCode : 500;
  if (err?.type === 'entity.too.large' || status === 413) {
    res.status(413).json({ error: { code: 'too_large', message: 'The request body is too large.' } });
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
  req.log?.error({ err }, 'unhandled error');
  res.status(500).json({ error: { code: 'internal', message: 'Something went wrong on our side. Try again.' } });
};
