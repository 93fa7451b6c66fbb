/**
 * The client's network address, for per-address rate limits and the audit log. Forwarded headers
 * are the client's word unless a proxy of ours wrote them, so they are read only as configured:
 * - `TRUST_PROXY_HOPS=N` (N ≥ 1): the N-th address from the right of `X-Forwarded-For` (each of our
 *   N proxies appends the address it saw; what lies further left was sent by the client);
 * - otherwise the socket's peer, which `scripts/serve.mjs` writes into `x-emberline-peer` on every
 *   request (it replaces a client's header of that name and marks the process, so the header is
 *   believed only there). Without either, the address is unknown ('').
 * `x-real-ip` and the client's own forwarded headers are never believed.
 */

export const PEER_HEADER = 'x-emberline-peer';

/** True in a process started by scripts/serve.mjs, which sets {@link PEER_HEADER} from the socket. */
export function peerHeaderTrusted(): boolean {
  return (globalThis as Record<symbol, unknown>)[Symbol.for('emberline.peerHeader')] === PEER_HEADER;
}

/**
 * @param headers the request headers
 * @param hops configured proxy hops (`TRUST_PROXY_HOPS`)
 * @param peerTrusted whether {@link PEER_HEADER} was written by our own server
 * @example clientAddress(new Headers({ 'x-forwarded-for': '198.51.100.7, 10.0.0.2' }), 1, false) // '10.0.0.2'
 */
export function clientAddress(headers: Headers, hops: number, peerTrusted: boolean): string {
  if (hops > 0) {
    const list = (headers.get('x-forwarded-for') ?? '').split(',').map((s) => s.trim()).filter(Boolean);
    return (list.length >= hops ? list[list.length - hops] : list[0] ?? '').slice(0, 64);
  }
  return peerTrusted ? (headers.get(PEER_HEADER) ?? '').slice(0, 64) : '';
}
