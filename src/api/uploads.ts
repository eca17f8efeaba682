import { z } from 'zod';
import { uploadViewSchema, type UploadView, type UploadViewModel } from '@shared/rider';
import { http, uploadSession, type ApiError } from './http';

const envelope = z.object({ upload: uploadViewSchema });

interface XhrAnswer {
  status: number;
  body: unknown;
}

function readBody(text: string): unknown {
  try {
    return JSON.parse(text) as unknown;
  } catch {
    return null;
  }
}

/**
 * One multipart POST through XMLHttpRequest, because fetch cannot report upload progress.
 * Resolves with whatever the server answered; only a network failure or an abort rejects.
 */
function send(file: File, view: UploadView, token: string, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<XhrAnswer> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', '/api/rider/uploads');
    xhr.setRequestHeader('Accept', 'application/json');
    xhr.setRequestHeader('X-CSRF-Token', token);
    xhr.withCredentials = true;
    xhr.upload.onprogress = (event) => {
      if (event.lengthComputable && event.total > 0) onProgress(event.loaded / event.total);
    };
    xhr.onload = () => resolve({ status: xhr.status, body: readBody(xhr.responseText) });
    xhr.onerror = () => reject(uploadSession.networkError());
    xhr.onabort = () => reject(uploadSession.networkError());
    signal?.addEventListener('abort', () => xhr.abort(), { once: true });
    const form = new FormData();
    form.append('view', view);
    form.append('file', file);
    xhr.send(form);
  });
}

/** Upload one photo or clip with progress (0–1); refreshes a stale CSRF token once, like http.ts. */
export async function uploadWithProgress(file: File, view: UploadView, onProgress: (fraction: number) => void, signal?: AbortSignal): Promise<UploadViewModel> {
  let answer = await send(file, view, await uploadSession.csrfToken(false), onProgress, signal);
  let error: ApiError | null = answer.status >= 200 && answer.status < 300 ? null : uploadSession.errorFromBody(answer.status, answer.body);
  if (error?.status === 403 && error.code === 'csrf_failed') {
    onProgress(0);
    answer = await send(file, view, await uploadSession.csrfToken(true), onProgress, signal);
    error = answer.status >= 200 && answer.status < 300 ? null : uploadSession.errorFromBody(answer.status, answer.body);
  }
  if (error) {
    if (error.status === 401) uploadSession.unauthorized(error);
    throw error;
  }
  const parsed = envelope.safeParse(answer.body);
  if (!parsed.success) throw uploadSession.unreadable(answer.status);
  return parsed.data.upload;
}

export const uploadsApi = {
  list: async () => (await http.get('/api/rider/uploads', z.object({ uploads: z.array(uploadViewSchema) }))).uploads,
  remove: (id: number) => http.deleteEmpty(`/api/rider/uploads/${id}`),
};
