/** Public API of the gap family of the calculation core. */
import type { MethodDefinition } from '../core/method';

/** Every `gap.*` method, for the registry. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const gapMethods: MethodDefinition<any>[] = [];
