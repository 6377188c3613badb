import { isIP } from 'node:net';

/**
 * Who may talk to the live server. A page on another site can make the browser send requests to a
 * local port, and a hostile DNS name can be pointed at 127.0.0.1 ("DNS rebinding"); both show in
 * the Host and Origin headers, which a browser sets and a page cannot forge. So every request must
 * name this server in Host, and a request that carries an Origin must come from this server's page.
 */

/** Loopback names a browser on this machine may use for a server bound to a loopback address. */
const LOOPBACK_NAMES = ['127.0.0.1', 'localhost', '[::1]'];

/** True for 127.0.0.0/8, ::1 and `localhost`. */
export function isLoopback(host: string): boolean {
  const h = host.replace(/^\[|\]$/g, '');
  return h === 'localhost' || h === '::1' || (isIP(h) === 4 && h.startsWith('127.'));
}

/** `host` as it appears in a Host header: IPv6 addresses in brackets, lower case. */
export function hostForHeader(host: string): string {
  return isIP(host) === 6 ? `[${host.toLowerCase()}]` : host.toLowerCase();
}

/**
 * The Host header values this server answers to: the bound host with the port, plus the loopback
 * names when it is bound to a loopback address, plus `extraNames` (the machine's addresses when
 * bound to every interface).
 */
export function allowedHosts(boundHost: string, port: number, extraNames: readonly string[] = []): Set<string> {
  const names = new Set<string>([hostForHeader(boundHost), ...extraNames.map(hostForHeader)]);
  if (isLoopback(boundHost)) for (const n of LOOPBACK_NAMES) names.add(n);
  return new Set([...names].map((n) => `${n}:${port}`));
}

export type Verdict = Readonly<{ ok: true }> | Readonly<{ ok: false; reason: string }>;

/**
 * Judge a request's headers: Host must be one of `allowed`; Origin, when present, must be
 * `http://` + one of them; a browser's `Sec-Fetch-Site: cross-site` is refused.
 */
export function judgeRequest(headers: Readonly<Record<string, string | string[] | undefined>>, allowed: ReadonlySet<string>): Verdict {
  const host = typeof headers.host === 'string' ? headers.host.toLowerCase() : '';
  if (!allowed.has(host)) return { ok: false, reason: `Host ${JSON.stringify(host)} is not this server` };
  const origin = headers.origin;
  if (origin !== undefined) {
    const o = typeof origin === 'string' ? origin.toLowerCase() : '';
    if (!o.startsWith('http://') || !allowed.has(o.slice('http://'.length))) return { ok: false, reason: `Origin ${JSON.stringify(o)} is not this server's page` };
  }
  if (headers['sec-fetch-site'] === 'cross-site') return { ok: false, reason: 'cross-site request' };
  return { ok: true };
}
