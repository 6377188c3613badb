/** Bad usage or input: printed without a stack trace, exit code 2. `path`: the option, file or parameter at fault, when known. */
export class UsageError extends Error {
  constructor(
    message: string,
    readonly path = '',
  ) {
    super(message);
  }
}
