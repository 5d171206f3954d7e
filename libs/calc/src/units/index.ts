/** The `units.convert` method (the conversions themselves live in `core/units.ts`). */
import type { MethodDefinition } from '../core/method';
import { convertMethod } from './convert/convert';

export const unitMethods: MethodDefinition<any>[] = [convertMethod];
