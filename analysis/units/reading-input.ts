/**
 * Input from people (the command line, the app's forms and routes) read into the analysis
 * functions, and its one error: an `InputError` says what is wrong in the user's words (the fields
 * as the user named them, the values as the user wrote them) and names the field (`field`, the
 * user's path) so a form can show the message beside it. The command line exits 2 on it; the app
 * answers 422.
 */
import { fieldReader, type FieldReader } from './read-fields';

export class InputError extends Error {
  override name = 'InputError';
  /** @param field the user's path of the field at fault (`pool.deepDepth`), when known */
  constructor(message: string, readonly field?: string) {
    super(message);
  }
}

/**
 * Runs a body with a field reader and turns every TypeError, RangeError or InputError it throws
 * into an InputError told in the user's words (see `inUserWords`), naming the field the message is
 * about, so every command and form reports errors the same way.
 * @example readingInput((read) => poolGeometry({ shape: 'round', diameterM: read.quantity({ diameter: '4 m' }, 'diameter', 'length', { as: 'diameterM' }) }))
 */
export function readingInput<T>(body: (read: FieldReader) => T): T {
  const read = fieldReader();
  try {
    return body(read);
  } catch (e) {
    if (e instanceof TypeError || e instanceof RangeError || e instanceof InputError) {
      const message = read.translate(e.message);
      throw new InputError(message, (e instanceof InputError ? e.field : undefined) ?? read.fieldOf(message));
    }
    throw e;
  }
}
