import type { RefusalCulprit } from '../model/graph';

/**
 * A model that cannot be solved. `message` is one line that names the
 * element, coupling or node at fault and what to change.
 */
export class ModelRefusal extends Error {
  readonly culprits: RefusalCulprit[];
  constructor(message: string, culprits: RefusalCulprit[] = []) {
    super(message.replace(/\s*\n\s*/g, ' '));
    this.name = 'ModelRefusal';
    this.culprits = culprits;
  }
}
