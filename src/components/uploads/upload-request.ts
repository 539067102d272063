/** Multipart upload with progress events (fetch cannot report upload progress; XMLHttpRequest can). */
import { ApiError } from '../ui/api-client';

export function uploadWithProgress<T>(
  url: string,
  form: FormData,
  onProgress: (fraction: number) => void,
  onSent: () => void,
): Promise<T> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.withCredentials = true;
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.upload.onload = () => onSent();
    xhr.onerror = () =>
      reject(new ApiError(0, 'NETWORK', 'The upload did not reach the server. Check the connection and try again.'));
    xhr.onload = () => {
      let data: { error?: { code: string; message: string; issues?: [] } } | null = null;
      try {
        data = JSON.parse(xhr.responseText);
      } catch {
        /* not JSON */
      }
      if (xhr.status >= 200 && xhr.status < 300) return resolve(data as T);
      const e = data?.error;
      reject(
        new ApiError(xhr.status, e?.code ?? 'ERROR', e?.message ?? `The server answered ${xhr.status}.`, e?.issues),
      );
    };
    xhr.send(form);
  });
}
