import { ApiError } from '../../../_components/api';

/**
 * Uploads a file as the request body (raw bytes, its type as Content-Type), reporting the share
 * sent; resolves with the server's answer, rejects with ApiError and the server's message.
 */
export 
function uploadWithProgress(url: string, file: File, onProgress: (f: number) => void): Promise<{ file: { id: string }; duplicate: boolean }> {
  return new Promise((resolve, reject) => {
    const xhr = new XMLHttpRequest();
    xhr.open('POST', url);
    xhr.setRequestHeader('Content-Type', file.type || 'application/octet-stream');
    xhr.upload.onprogress = (e) => e.lengthComputable && onProgress(e.loaded / e.total);
    xhr.onload = () => {
      let body: Record<string, unknown> = {};
      try {
        body = JSON.parse(xhr.responseText);
      } catch {
        /* not JSON */
      }
      if (xhr.status >= 200 && xhr.status < 300) resolve(body as { file: { id: string }; duplicate: boolean });
      else reject(new ApiError(xhr.status, String(body.message ?? `Upload failed (${xhr.status}).`)));
    };
    xhr.onerror = () => reject(new ApiError(0, 'The upload was interrupted: check the connection and try again.'));
    xhr.send(file);
  });
}
