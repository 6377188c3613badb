/**
 * A DXF file that cannot be read at all (not DXF, binary, truncated, beyond the size limits).
 * The CLI prints the message without a stack trace and exits with code 2. Problems that still let
 * a part be formed are findings, not errors.
 */
export class DxfReadError extends Error {
  constructor(message: string) {
    super(message);
    this.name = 'DxfReadError';
  }
}
