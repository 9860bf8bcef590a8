/** A command's refusal: the message goes to stderr and the process exits with the code. */
export class CliExit extends Error {
  constructor(
    readonly exitCode: number,
    message: string,
  ) {
    super(message);
  }
}
