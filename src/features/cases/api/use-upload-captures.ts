import { useQueryClient } from '@tanstack/react-query';
import { useCallback, useState } from 'react';
import type { CaptureMetadataInput, UploadResponse } from '../../../../shared/schemas/captures';
import { CSRF_HEADER } from '../../../../shared/schemas/auth';
import { ApiError, apiErrorFrom, currentCsrfToken } from '../../../lib/api-client';
import { caseKeys } from './case-keys';

/** State of one upload request (several files go in one request, index-aligned with their metadata). */
export type UploadState =
  | { kind: 'idle' }
  | { kind: 'uploading'; loaded: number; total: number }
  | { kind: 'done'; captureIds: number[] }
  | { kind: 'error'; error: ApiError };

/**
 * POST /api/cases/:id/captures as multipart (metadata first, then the files) through XHR, which
 * reports upload progress (fetch does not). The case is read again afterwards.
 */
export function useUploadCaptures(caseId: number) {
  const queryClient = useQueryClient();
  const [state, setState] = useState<UploadState>({ kind: 'idle' });
  const upload = useCallback(
    async (files: File[], metadata: CaptureMetadataInput[]): Promise<UploadResponse | null> => {
      const form = new FormData();
      form.append('metadata', JSON.stringify(metadata));
      for (const f of files) form.append('files', f, f.name);
      const total = files.reduce((s, f) => s + f.size, 0);
      setState({ kind: 'uploading', loaded: 0, total });
      let token: string;
      try {
        token = await currentCsrfToken();
      } catch (error) {
        setState({ kind: 'error', error: error instanceof ApiError ? error : new ApiError(0, 'network_error', 'The server did not answer. Try again.') });
        return null;
      }
      return new Promise((resolve) => {
        const xhr = new XMLHttpRequest();
        xhr.open('POST', `/api/cases/${caseId}/captures`);
        xhr.setRequestHeader(CSRF_HEADER, token);
        xhr.setRequestHeader('accept', 'application/json');
        xhr.upload.onprogress = (e) => setState({ kind: 'uploading', loaded: e.loaded, total: e.lengthComputable ? e.total : total });
        xhr.onerror = () => {
          setState({ kind: 'error', error: new ApiError(0, 'network_error', 'The upload was interrupted. Check the connection and upload the files again.') });
          resolve(null);
        };
        xhr.onload = () => {
          void queryClient.invalidateQueries({ queryKey: caseKeys.detail(caseId) });
          void queryClient.invalidateQueries({ queryKey: caseKeys.lists() });
          if (xhr.status >= 200 && xhr.status < 300) {
            const body = JSON.parse(xhr.responseText) as UploadResponse;
            setState({ kind: 'done', captureIds: body.captures.map((c) => c.id) });
            resolve(body);
          } else {
            setState({ kind: 'error', error: apiErrorFrom(xhr.status, xhr.statusText, xhr.responseText) });
            resolve(null);
          }
        };
        xhr.send(form);
      });
    },
    [caseId, queryClient],
  );
  return { state, upload, reset: () => setState({ kind: 'idle' }) };
}
