import type { SegmentPreview } from '@/app/_lib/imports/sensor-preview';
import { ApiError } from '../../../_components/api';

/**
 * Reads the preview stream of POST …/segments: progress lines, then the result or an error.
 * @throws ApiError with the server's message (422 for a bad mapping, file or threshold)
 */
export async function fetchPreview(url: string, body: unknown, onProgress: (f: number) => void = () => undefined, signal?: AbortSignal): Promise<SegmentPreview> {
  const res = await fetch(url, { method: 'POST', headers: { 'Content-Type': 'application/json' }, body: JSON.stringify(body), credentials: 'same-origin', signal });
  if (!res.ok || !res.body) {
    const j = (await res.json().catch(() => ({}))) as { message?: string };
    throw new ApiError(res.status, j.message ?? `The log could not be read (${res.status}).`);
  }
  const reader = res.body.getReader();
  const dec = new TextDecoder();
  let buf = '';
  for (;;) {
    const { value, done } = await reader.read();
    if (value) buf += dec.decode(value, { stream: true });
    let nl: number;
    while ((nl = buf.indexOf('\n')) >= 0) {
      const line = buf.slice(0, nl);
      buf = buf.slice(nl + 1);
      if (!line.trim()) continue;
      const msg = JSON.parse(line) as { progress?: { bytesDone: number; bytesTotal: number }; result?: SegmentPreview; error?: { status: number; message: string } };
      if (msg.progress) onProgress(msg.progress.bytesTotal > 0 ? msg.progress.bytesDone / msg.progress.bytesTotal : 0);
      if (msg.error) throw new ApiError(msg.error.status, msg.error.message);
      if (msg.result) return msg.result;
    }
    if (done) break;
  }
  throw new ApiError(0, 'The server stopped before the log was read; try again.');
}
