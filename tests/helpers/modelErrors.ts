/** The ModelError a model text is rejected with; fails when the text is accepted or throws otherwise. */
import { loadModelText } from '../../corpus/format/load.js';
import { ModelError } from '../../corpus/format/errors.js';

export function errorOf(text: string, file = 'm.yaml'): ModelError {
  try {
    loadModelText(text, file);
  } catch (e) {
    if (e instanceof ModelError) return e;
    throw e;
  }
  throw new Error('the model was accepted');
}
