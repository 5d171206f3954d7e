/** Public API of the uncertainty family of the calculation core. */
import type { MethodDefinition } from '../core/method';

/** Every `uncertainty.*` method, for the registry. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const uncertaintyMethods: MethodDefinition<any>[] = [];
