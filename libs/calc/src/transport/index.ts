/** Public API of the transport family of the calculation core. */
import type { MethodDefinition } from '../core/method';

/** Every `transport.*` method, for the registry. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const transportMethods: MethodDefinition<any>[] = [];
