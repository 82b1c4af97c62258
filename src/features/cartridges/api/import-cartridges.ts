import { useMutation, useQueryClient } from '@tanstack/react-query';
import type { ApiErrorBody } from '@shared/types/api';
import type { ImportPreviewDto, ImportResultDto } from '@shared/types/cartridges';
import { ApiError } from '@/lib/api-client';
import { cartridgeKeys } from './keys';

/**
 * The delivery file goes up as text/csv (the JSON wrapper cannot carry it); errors come back
 * in the API's usual shape and are raised as ApiError like every other call.
 */
async function postCsv<T>(csv: string, dryRun: boolean): Promise<T> {
  let res: Response;
  try {
    res = await fetch(`/api/cartridges/import${dryRun ? '?dryRun=true' : ''}`, {
      method: 'POST',
      credentials: 'same-origin',
      headers: {
        'content-type': 'text/csv; charset=utf-8',
        accept: 'application/json',
        ...(dryRun ? {} : { 'idempotency-key': `import-${Date.now().toString(36)}-${Math.random().toString(36).slice(2, 12)}` }),
      },
      body: csv,
    });
  } catch {
    throw new ApiError(0, 'offline', 'Porewise cannot be reached. Check the connection and try again.');
  }
  const data = (await res.json().catch(() => null)) as unknown;
  if (!res.ok) {
    const err = (data as ApiErrorBody | null)?.error;
    throw new ApiError(res.status, err?.code ?? 'http_error', err?.message ?? `The server answered ${res.status}.`, err?.fields);
  }
  return data as T;
}

export const previewImport = (csv: string) => postCsv<ImportPreviewDto>(csv, true);
export const importCartridges = (csv: string) => postCsv<ImportResultDto>(csv, false);

/** Checks a delivery file; saves nothing. */
export function usePreviewImport() {
  return useMutation({ mutationFn: previewImport });
}

export function useImportCartridges() {
  const qc = useQueryClient();
  return useMutation({ mutationFn: importCartridges, onSuccess: () => qc.invalidateQueries({ queryKey: cartridgeKeys.all }) });
}
