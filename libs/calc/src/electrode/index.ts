/** Public API of the electrode family of the calculation core. */
import type { MethodDefinition } from '../core/method';

/** Every `electrode.*` method, for the registry. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const electrodeMethods: MethodDefinition<any>[] = [];
