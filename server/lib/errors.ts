/** Typed HTTP errors: services throw these, the error handler turns them into `{ error: {...} }`. */
export class HttpError extends Error {
  constructor(
    readonly status: number,
    readonly code: string,
    message: string,
    readonly fields?: Record<string, string>,
    /** More members of the error envelope beside code, message and fields (e.g. `reasons`, `record`). */
    readonly extra?: Record<string, unknown>,
  ) {
    super(message);
  }
}

export const badRequest = (message: string, fields?: Record<string, string>) =>
  new HttpError(400, 'invalid_input', message, fields);
export const unauthorized = (message = 'Sign in to continue.') => new HttpError(401, 'unauthenticated', message);
export const forbidden = (message = 'Your role does not allow this.') => new HttpError(403, 'forbidden', message);
export const notFound = (what = 'Record') => new HttpError(404, 'not_found', `${what} not found.`);
export const conflict = (message: string, code = 'conflict') => new HttpError(409, code, message);
export const gone = (message: string) => new HttpError(410, 'gone', message);

/** 409 when a row is held by a record: names the record and offers to archive instead. */
export const inRecord = (message: string, record: { kind: string; id: string; label: string }) =>
  new HttpError(409, 'in_record', message, undefined, { record, canArchive: true });
