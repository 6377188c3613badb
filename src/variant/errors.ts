/**
 * A variant that cannot be made as asked (a prop the motor cannot turn, a wheelbase below the
 * clearance minimum, arms shorter than their clamp). `option` names the command-line option or
 * design path at fault. The CLI prints the message and exits with code 2.
 */
export class VariantRequestError extends Error {
  constructor(
    readonly option: string,
    readonly value: unknown,
    readonly reason: string,
  ) {
    super(`${option}: ${typeof value === 'string' ? value : JSON.stringify(value)} ${reason}`);
    this.name = 'VariantRequestError';
  }
}
