import { useMutation } from '@tanstack/react-query';
import type { LoggerMapping } from '@shared/schemas/logger';
import type { ApiErrorBody } from '@shared/types/api';
import type { LoggerImportResultDto, LoggerPreviewDto } from '@shared/types/logger';
import { ApiError } from '@/lib/api-client';

export type LoggerImportRequest = { runId: string; file: File; stageIndex: number; profileId?: string; mapping?: LoggerMapping };

/**
 * The logger file goes up as multipart (the JSON wrapper cannot carry it); errors come back in
 * the API's usual shape and are raised as ApiError like every other call. Sending the same file
 * again is harmless: the server imports a file once per stage.
 */
async function postForm<T>(req: LoggerImportRequest, dryRun: boolean): Promise<T> {
  const form = new FormData();
  form.set('stageIndex', String(req.stageIndex));
  if (req.profileId) form.set('profileId', req.profileId);
  if (req.mapping) form.set('mapping', JSON.stringify(req.mapping));
  form.set('file', req.file, req.file.name);
  let res: Response;
  try {
    res = await fetch(`/api/runs/${encodeURIComponent(req.runId)}/readings/import${dryRun ? '?dryRun=true' : ''}`, {
      method: 'POST',
      credentials: 'same-origin',
      headers: { accept: 'application/json' },
      body: form,
    });
  } catch {
    throw new ApiError(0, 'offline', 'Porewise cannot be reached. Check the connection and try again.');
  }
  const data = (await res.json().catch(() => null)) as unknown;
  if (!res.ok) {
    const err = (data as ApiErrorBody | null)?.error;
    throw new ApiError(res.status, err?.code ?? 'http_error', err?.message ?? `The server answered ${res.status}.`, err?.fields, err ?? null);
  }
  return data as T;
}

export const previewLoggerFile = (req: LoggerImportRequest) => postForm<LoggerPreviewDto>(req, true);
export const importLoggerFile = (req: LoggerImportRequest) => postForm<LoggerImportResultDto>(req, false);

/** Reads the file on the server and answers the first rows, the errors and a chart; stores nothing. */
export function usePreviewLoggerFile() {
  return useMutation({ mutationFn: previewLoggerFile });
}

/** Imports the file; the caller refreshes the run. */
export function useImportLoggerFile() {
  return useMutation({ mutationFn: importLoggerFile });
}
