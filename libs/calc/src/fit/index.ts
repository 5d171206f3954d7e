/** Public API of the fit family of the calculation core. */
import type { MethodDefinition } from '../core/method';

/** Every `fit.*` method, for the registry. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const fitMethods: MethodDefinition<any>[] = [];
