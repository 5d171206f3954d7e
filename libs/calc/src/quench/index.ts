/** Public API of the quench family of the calculation core. */
import type { MethodDefinition } from '../core/method';

/** Every `quench.*` method, for the registry. */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const quenchMethods: MethodDefinition<any>[] = [];
