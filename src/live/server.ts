import { createServer, type IncomingMessage, type Server, type ServerResponse } from 'node:http';
import type { AddressInfo } from 'node:net';
import { networkInterfaces } from 'node:os';
import { UsageError } from '../cli/io.js';
import { EditRefused, type FieldEdit, type LiveSession } from './session.js';
import { allowedHosts, hostForHeader, judgeRequest } from './security.js';
import type { LiveModel } from './model.js';

/** Largest request body (an edit is a few hundred bytes). */
export const MAX_BODY_BYTES = 64 * 1024;
/** Longest request target. */
export const MAX_URL_LENGTH = 2048;
/** Pages listening for changes at once. */
export const MAX_EVENT_CLIENTS = 32;

/** A route that answers with bytes: downloads, the modes table, a variant preview. */
export type Handler = (url: URL, res: ServerResponse) => Promise<void> | void;

export type LiveServerOptions = Readonly<{
  session: LiveSession;
  host: string;
  /** 0: the system picks a free port. */
  port: number;
  /** The page's script and style sheet, served from memory. */
  assets: Readonly<{ script: string; style: string }>;
  /** More GET routes by exact path (downloads, on-request figures). */
  routes?: Readonly<Record<string, Handler>>;
  /** Prefix routes (`/download/part/`): the handler gets the rest of the path from the URL. */
  prefixRoutes?: Readonly<Record<string, Handler>>;
  log?: (line: string) => void;
}>;

export type LiveServer = Readonly<{ url: string; port: number; server: Server; close: () => Promise<void> }>;

const SECURITY_HEADERS: Record<string, string> = {
  'Content-Security-Policy': "default-src 'none'; script-src 'self'; style-src 'self'; img-src 'self' data:; connect-src 'self'; base-uri 'none'; form-action 'none'; frame-ancestors 'none'",
  'X-Content-Type-Options': 'nosniff',
  'Referrer-Policy': 'no-referrer',
  'Cross-Origin-Resource-Policy': 'same-origin',
  'Cache-Control': 'no-store',
};

/** Send a complete response with the security headers. */
export function send(res: ServerResponse, status: number, type: string, body: string | Uint8Array, extra: Record<string, string> = {}): void {
  res.writeHead(status, { ...SECURITY_HEADERS, 'Content-Type': type, 'Content-Length': String(Buffer.byteLength(body)), ...extra });
  res.end(body);
}

/** A JSON answer; errors use `{ "error": { "message", "path" } }` like the CLI's `--json`. */
export function sendJson(res: ServerResponse, status: number, value: unknown): void {
  send(res, status, 'application/json; charset=utf-8', JSON.stringify(value));
}

export const errorBody = (message: string, path = ''): unknown => ({ error: { message, path } });

/** JSON for a `<script type="application/json">` block: `<` escaped so the text cannot close the element. */
const scriptJson = (v: unknown): string => JSON.stringify(v).replace(/</g, '\\u003c').replace(/\u2028/g, '\\u2028').replace(/\u2029/g, '\\u2029');

const escapeHtml = (s: string): string => s.replace(/&/g, '&amp;').replace(/</g, '&lt;').replace(/>/g, '&gt;').replace(/"/g, '&quot;');

/**
 * The page: a shell whose script renders the embedded model before the load event (so a headless
 * browser's DOM dump already holds the pictures), then follows the server's change events.
 */
export function pageHtml(model: LiveModel): string {
  return [
    '<!DOCTYPE html>',
    '<html lang="en">',
    '<head>',
    '<meta charset="utf-8">',
    '<meta name="viewport" content="width=device-width, initial-scale=1">',
    `<title>${escapeHtml(model.name || model.file)} — framewright live</title>`,
    '<link rel="stylesheet" href="/app.css">',
    '</head>',
    '<body>',
    '<div id="app"></div>',
    `<script id="initial-model" type="application/json">${scriptJson(model)}</script>`,
    '<script src="/app.js"></script>',
    '</body>',
    '</html>',
    '',
  ].join('\n');
}

/** Read a request body up to the limit; null when it is larger (the caller answers 413). */
function readBody(req: IncomingMessage): Promise<string | null> {
  return new Promise((resolve, reject) => {
    const declared = Number(req.headers['content-length'] ?? 0);
    if (declared > MAX_BODY_BYTES) {
      req.resume();
      resolve(null);
      return;
    }
    const chunks: Buffer[] = [];
    let size = 0;
    let over = false;
    req.on('data', (c: Buffer) => {
      size += c.length;
      if (size > MAX_BODY_BYTES) over = true;
      else chunks.push(c);
    });
    req.on('end', () => resolve(over ? null : Buffer.concat(chunks).toString('utf8')));
    req.on('error', reject);
  });
}

/** The machine's own addresses, for a server bound to every interface. */
function ownAddresses(): string[] {
  return Object.values(networkInterfaces())
    .flat()
    .filter((a): a is NonNullable<typeof a> => !!a)
    .map((a) => a.address);
}

/**
 * Start the live server for one session. It answers only requests that name it in Host (and, with
 * an Origin, come from its own page), takes bodies up to 64 KiB, and writes nothing but the
 * session's design file (through `LiveSession.applyEdits`).
 */
export async function startLiveServer(o: LiveServerOptions): Promise<LiveServer> {
  const { session } = o;
  const log = o.log ?? (() => undefined);
  const clients = new Set<ServerResponse>();
  let allowed = new Set<string>();

  const handle = async (req: IncomingMessage, res: ServerResponse): Promise<void> => {
    if ((req.url ?? '').length > MAX_URL_LENGTH) return send(res, 414, 'text/plain; charset=utf-8', 'request target too long\n');
    const verdict = judgeRequest(req.headers, allowed);
    if (!verdict.ok) {
      log(`refused ${req.method} ${req.url}: ${verdict.reason}`);
      return send(res, 403, 'text/plain; charset=utf-8', `forbidden: ${verdict.reason}\n`);
    }
    const url = new URL(req.url ?? '/', 'http://localhost');
    if (req.method === 'POST') {
      if (url.pathname !== '/api/edit') return send(res, 405, 'text/plain; charset=utf-8', 'only /api/edit takes POST\n', { Allow: 'GET' });
      if (!/^application\/json\b/i.test(req.headers['content-type'] ?? '')) return sendJson(res, 415, errorBody('send the edit as application/json'));
      const body = await readBody(req);
      if (body === null) return sendJson(res, 413, errorBody(`request body over ${MAX_BODY_BYTES} bytes`));
      let edits: FieldEdit[];
      try {
        edits = (JSON.parse(body) as { edits: FieldEdit[] }).edits;
      } catch {
        return sendJson(res, 400, errorBody('the body is not JSON'));
      }
      try {
        const outcome = session.applyEdits(edits);
        // A refused edit is an answer, not a failed request: 200 with ok false and the problems.
        return sendJson(res, 200, outcome);
      } catch (e) {
        if (e instanceof EditRefused) return sendJson(res, 400, errorBody(e.message, e.path));
        if (e instanceof UsageError) return sendJson(res, 500, errorBody(`could not write the design file: ${(e as Error).message}`));
        throw e;
      }
    }
    if (req.method !== 'GET' && req.method !== 'HEAD') return send(res, 405, 'text/plain; charset=utf-8', 'method not allowed\n', { Allow: 'GET, POST' });
    switch (url.pathname) {
      case '/':
        return send(res, 200, 'text/html; charset=utf-8', pageHtml(session.model));
      case '/app.js':
        return send(res, 200, 'text/javascript; charset=utf-8', o.assets.script);
      case '/app.css':
        return send(res, 200, 'text/css; charset=utf-8', o.assets.style);
      case '/api/model':
        return sendJson(res, 200, session.model);
      case '/api/events': {
        if (clients.size >= MAX_EVENT_CLIENTS) return send(res, 503, 'text/plain; charset=utf-8', 'too many open pages\n');
        res.writeHead(200, { ...SECURITY_HEADERS, 'Content-Type': 'text/event-stream; charset=utf-8', Connection: 'keep-alive' });
        res.write(`event: model\ndata: ${JSON.stringify({ version: session.version })}\n\n`);
        clients.add(res);
        req.on('close', () => clients.delete(res));
        return;
      }
      case '/favicon.ico':
        return send(res, 204, 'text/plain', '');
      default: {
        const route = o.routes?.[url.pathname];
        if (route) return route(url, res);
        const prefix = Object.keys(o.prefixRoutes ?? {}).find((p) => url.pathname.startsWith(p));
        if (prefix) return o.prefixRoutes![prefix](url, res);
        return send(res, 404, 'text/plain; charset=utf-8', 'not found\n');
      }
    }
  };

  const server = createServer((req, res) => {
    handle(req, res).catch((e: unknown) => {
      log(`internal error on ${req.method} ${req.url}: ${(e as Error)?.stack ?? String(e)}`);
      if (!res.headersSent) sendJson(res, 500, errorBody('internal error; see the terminal running framewright live'));
      else res.end();
    });
  });
  server.headersTimeout = 10_000;
  server.requestTimeout = 30_000;
  server.maxHeadersCount = 64;

  const unsubscribe = session.onChange((m) => {
    for (const c of clients) c.write(`event: model\ndata: ${JSON.stringify({ version: m.version })}\n\n`);
  });
  // A comment line now and then keeps idle connections (and proxies) from timing the stream out.
  const heartbeat = setInterval(() => {
    for (const c of clients) c.write(': still here\n\n');
  }, 20_000);
  heartbeat.unref();

  await new Promise<void>((resolve, reject) => {
    server.once('error', reject);
    server.listen(o.port, o.host, () => resolve());
  });
  const port = (server.address() as AddressInfo).port;
  const everywhere = o.host === '0.0.0.0' || o.host === '::';
  allowed = allowedHosts(everywhere ? '127.0.0.1' : o.host, port, everywhere ? ownAddresses() : []);
  const shownHost = everywhere ? '127.0.0.1' : hostForHeader(o.host);
  return {
    url: `http://${shownHost}:${port}/`,
    port,
    server,
    close: () =>
      new Promise<void>((resolve) => {
        clearInterval(heartbeat);
        unsubscribe();
        for (const c of clients) c.end();
        clients.clear();
        server.closeAllConnections();
        server.close(() => resolve());
      }),
  };
}
