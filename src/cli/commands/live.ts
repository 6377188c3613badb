import type { Command } from 'commander';
import { UsageError } from '../io.js';

export type LiveCliOptions = { port?: string; host?: string; open?: boolean };

function parsePort(text: string | undefined): number {
  if (text === undefined) return 0;
  if (!/^\d+$/.test(text.trim()) || Number(text) < 1 || Number(text) > 65535) throw new UsageError(`--port: ${JSON.stringify(text)} must be a port number from 1 to 65535`);
  return Number(text);
}

function parseHost(text: string | undefined): string {
  const h = (text ?? '127.0.0.1').trim();
  if (!/^[A-Za-z0-9.:-]+$/.test(h) || h.length > 253) throw new UsageError(`--host: ${JSON.stringify(text)} must be an IP address or host name`);
  return h;
}

/** Open the page in the desktop's browser; a failure only costs the convenience (the URL is printed). */
async function openBrowser(url: string): Promise<void> {
  const [cmd, args] = process.platform === 'darwin' ? ['open', [url]] : process.platform === 'win32' ? ['cmd', ['/c', 'start', '', url]] : ['xdg-open', [url]];
  // Loaded here, not at start-up: every other command would pay for it.
  const { spawn } = await import('node:child_process');
  try {
    const child = spawn(cmd, args, { stdio: 'ignore', detached: true });
    child.on('error', () => undefined);
    child.unref();
  } catch {
    // no desktop browser here
  }
}

export function registerLive(program: Command): void {
  program
    .command('live')
    .description('edit a design in the browser: the frame, its findings and figures follow every change, and edits are written back to the file')
    .argument('<design>', 'design file (YAML or JSON); the only file the page writes')
    .option('--port <n>', 'port to listen on (default: a free one)')
    .option('--host <address>', 'address to listen on (default 127.0.0.1, this machine only)')
    .option('--no-open', 'do not open the page in a browser')
    .action(async (designPath: string, opts: LiveCliOptions) => {
      const port = parsePort(opts.port);
      const host = parseHost(opts.host);
      // The server and its pipeline load only for this command, so `--help` stays fast.
      const { openLive } = await import('../../live/index.js');
      const live = await openLive({ designPath, host, port, log: (line) => process.stderr.write(`framewright live: ${line}\n`) });
      process.stdout.write(`framewright live: ${live.session.label} at ${live.url}\n(Ctrl-C to stop; edits are saved to the file as you make them)\n`);
      if (opts.open !== false) await openBrowser(live.url);
      await new Promise<void>((resolve) => {
        const stop = (): void => {
          process.off('SIGINT', stop);
          process.off('SIGTERM', stop);
          void live.close().then(resolve);
        };
        process.on('SIGINT', stop);
        process.on('SIGTERM', stop);
      });
    });
}
