import { createServer, type AddressInfo } from 'node:net';
import { describe, expect, it } from 'vitest';
import { runCli, STACK_LINE } from '../helpers/cli.js';

/** `framewright live` refuses bad input like every command: exit 2, a message naming it, no trace. */

describe('framewright live: bad input', () => {
  const cases: Array<[string, string[], RegExp]> = [
    ['a missing file', ['live', 'designs/none.yaml', '--no-open'], /cannot read designs\/none\.yaml/],
    ['a DXF drawing', ['live', 'test/fixtures/dxf/none.dxf', '--no-open'], /DXF drawing/],
    ['a port that is not a number', ['live', 'designs/tessel-5.yaml', '--port', 'http', '--no-open'], /--port: "http" must be a port number from 1 to 65535/],
    ['a port out of range', ['live', 'designs/tessel-5.yaml', '--port', '70000', '--no-open'], /--port/],
    ['a host that is no address', ['live', 'designs/tessel-5.yaml', '--host', 'a b', '--no-open'], /--host/],
  ];
  for (const [what, args, message] of cases) {
    it(what, () => {
      const r = runCli(args);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(message);
      expect(r.stderr).not.toMatch(STACK_LINE);
    });
  }

  it('a port in use', async () => {
    const blocker = createServer();
    await new Promise<void>((resolve) => blocker.listen(0, '127.0.0.1', () => resolve()));
    const port = (blocker.address() as AddressInfo).port;
    try {
      const r = runCli(['live', 'designs/tessel-5.yaml', '--port', String(port), '--no-open']);
      expect(r.code).toBe(2);
      expect(r.stderr).toMatch(/the port is in use/);
    } finally {
      blocker.close();
    }
  });

  it('is listed in --help', () => {
    expect(runCli(['--help']).stdout).toMatch(/^\s+live\b/m);
    expect(runCli(['live', '--help']).stdout).toMatch(/--no-open/);
  });
});
