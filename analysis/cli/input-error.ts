/** Malformed command-line input: the CLI prints the message and exits with code 2. */
import { fieldReader, type FieldReader } from '../units/read-fields';

export class InputError extends Error {
  override name = 'InputError';
}

/**
 * Runs a command's body with a field reader and turns every TypeError, RangeError or InputError
 * it throws into an InputError told in the user's words (the fields as the user named them, the
 * values as the user wrote them, see `inUserWords`), so every command reports errors the same way.
 * @example return readingInput((read) => poolGeometry({ shape, deepDepthM: read.quantity(o, 'deepDepth', 'length', { as: 'deepDepthM' }) }))
 */
export function readingInput<T>(body: (read: FieldReader) => T): T {
  const read = fieldReader();
  try {
    return body(read);
  } catch (e) {
    if (e instanceof TypeError || e instanceof RangeError || e instanceof InputError) throw new InputError(read.translate(e.message));
    throw e;
  }
}
