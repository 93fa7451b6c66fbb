/** Malformed command-line input: the CLI prints the message and exits with code 2. */
export class InputError extends Error {
  override name = 'InputError';
}
