/** Rate methods of the calculation core (classical Marcus, MLJ, crossover, ruler, cross relation). */
import type { MethodDefinition } from '../core/method';
import { crossRelationMethod } from './cross-relation/cross-relation';
import { crossRelationWorkMethod } from './cross-relation-work/cross-relation-work';
import { crossoverMethod } from './crossover/crossover';
import { landauZenerMethod } from './landau-zener/landau-zener';
import { marcusMethod } from './marcus/marcus';
import { mljMethod } from './mlj/mlj';
import { mljThermalMethod } from './mlj-thermal/mlj-thermal';
import { rulerMethod } from './ruler/ruler';

/** Every `rate.*` method, for the registry. */
export const rateMethods: MethodDefinition<any>[] = [
  marcusMethod,
  mljMethod,
  mljThermalMethod,
  crossoverMethod,
  landauZenerMethod,
  rulerMethod,
  crossRelationMethod,
  crossRelationWorkMethod,
];
