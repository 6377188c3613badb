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

/** The closest variant that was built but fails a check, kept so `--force` can write it (marked invalid). */
export type InvalidAttempt = Readonly<{ text: string; errors: number; warnings: number }>;

/**
 * A variant that the rules cannot make valid: no arm section meets the size rule within its limits,
 * or every candidate fails a check. `constraint` names what cannot be met, `alternative` the nearest
 * change that would work. The CLI prints both and exits with code 1; nothing is written unless asked.
 */
export class VariantRefusal extends Error {
  constructor(
    readonly props: string,
    readonly constraint: string,
    readonly alternative: string,
    readonly attempt: InvalidAttempt | null,
  ) {
    super(`${props}: cannot meet ${constraint}.\nNearest valid alternative: ${alternative}`);
    this.name = 'VariantRefusal';
  }
}
