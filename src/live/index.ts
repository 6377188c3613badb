import { existsSync, readFileSync, realpathSync, statSync } from 'node:fs';
import { relative } from 'node:path';
import { readText, UsageError } from '../cli/io.js';
import { defaultShopPath, packagePath } from '../cli/packageRoot.js';
import { designJsonSchema } from '../params/jsonSchema.js';
import { parseShopText } from '../params/shop.js';
import type { SchemaNode } from './form.js';
import { liveRoutes } from './routes.js';
import { isLoopback } from './security.js';
import { startLiveServer, type LiveServer } from './server.js';
import { LiveSession } from './session.js';

export { LiveSession } from './session.js';
export { startLiveServer } from './server.js';

export type LiveOptions = Readonly<{
  designPath: string;
  host: string;
  port: number;
  /** The shop profile for the quote drawing (default: the example shipped in designs/). */
  shopPath?: string;
  log?: (line: string) => void;
}>;

/** The page's script and style sheet, built by `npm run build` (scripts/bundle-page.mjs) into dist/live/page. */
function pageAssets(): { script: string; style: string } {
  const js = packagePath('dist', 'live', 'page', 'app.js');
  if (!existsSync(js)) throw new UsageError('the live page is not built; run `npm run build` first');
  return { script: readFileSync(js, 'utf8'), style: readFileSync(packagePath('dist', 'live', 'page', 'app.css'), 'utf8') };
}

/**
 * Open a design for live editing: check the file, build its model, start the server on
 * `host:port` (0 = a free port) and watch the file. Throws UsageError for a missing, unreadable or
 * DXF file, a port in use, or an address that cannot be bound.
 */
export async function openLive(o: LiveOptions): Promise<LiveServer & { session: LiveSession }> {
  if (/\.dxf$/i.test(o.designPath)) throw new UsageError(`${o.designPath} is a DXF drawing; live edits a design file (YAML or JSON)`);
  let real: string;
  try {
    real = realpathSync(o.designPath);
    if (!statSync(real).isFile()) throw new UsageError(`${o.designPath} is not a file`);
  } catch (e) {
    if (e instanceof UsageError) throw e;
    throw new UsageError(`cannot read ${o.designPath}: ${(e as NodeJS.ErrnoException).code ?? (e as Error).message}`);
  }
  const shopPath = o.shopPath ?? defaultShopPath();
  const shop = parseShopText(readText(shopPath, 'a shop profile (YAML)'), shopPath);
  const label = relative(process.cwd(), o.designPath) || o.designPath;
  const session = new LiveSession(real, label.startsWith('..') ? o.designPath : label, designJsonSchema() as SchemaNode);
  session.load();
  const assets = pageAssets();
  const { routes, prefixRoutes } = liveRoutes(session, shop);
  let server: LiveServer;
  try {
    server = await startLiveServer({ session, host: o.host, port: o.port, assets, routes, prefixRoutes, ...(o.log ? { log: o.log } : {}) });
  } catch (e) {
    session.close();
    const code = (e as NodeJS.ErrnoException).code;
    if (code === 'EADDRINUSE') throw new UsageError(`--port ${o.port}: the port is in use; pick another or leave --port out`);
    if (code === 'EADDRNOTAVAIL' || code === 'ENOTFOUND' || code === 'EACCES') throw new UsageError(`--host ${o.host} --port ${o.port}: cannot listen there (${code})`);
    throw e;
  }
  session.watch();
  if (!isLoopback(o.host)) o.log?.(`caution: listening on ${o.host}, not this machine's loopback address: anyone who can reach it can edit ${label}`);
  return {
    ...server,
    session,
    close: async () => {
      session.close();
      await server.close();
    },
  };
}
