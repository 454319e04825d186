// One file to the API as multipart/form-data, with upload progress. XMLHttpRequest rather than
// fetch, because fetch reports no upload progress. A same-origin XHR carries the page's Origin,
// which is what the server's cross-site check (server/security.ts) looks at.
import { ApiError } from '@/lib/http';

export function sendFile<T>(method: 'POST', path: string, file: Blob, fileName: string, onProgress?: (fraction: number) => void): Promise<T> {
  return new Promise<T>((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open(method, `/api${path}`);
    xhr.setRequestHeader('accept', 'application/json');
    xhr.upload.onprogress = (e) => {
      if (e.lengthComputable && e.total > 0) onProgress?.(e.loaded / e.total);
    };
    xhr.onload = () => {
      let data: { error?: { code?: string; message?: string; details?: ApiError['details'] } } | null = null;
      try {
        data = JSON.parse(xhr.responseText);
      } catch {
        data = null;
      }
      if (xhr.status >= 200 && xhr.status < 300) return resolve(data as T);
      const e = data?.error ?? {};
      reject(new ApiError(xhr.status, e.code ?? 'internal', e.message ?? `Upload failed (${xhr.status})`, e.details));
    };
    xhr.onerror = () => reject(new ApiError(0, 'offline', 'No connection to the Jugline server'));
    xhr.onabort = () => reject(new ApiError(0, 'aborted', 'The upload was stopped'));
    const form = new FormData();
    form.append('file', file, fileName);
    xhr.send(form);
  });
}
