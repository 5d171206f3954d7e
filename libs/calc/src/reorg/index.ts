/** Reorganization-energy methods of this folder (`reorg.gapSamples` lives in `gap/`). */
import type { MethodDefinition } from '../core/method';
import { fourPointMethod } from './four-point/four-point';
import { normalModesMethod } from './normal-modes/normal-modes';
import { twoSphereMethod } from './two-sphere/two-sphere';

/** `reorg.twoSphere`, `reorg.fourPoint` and `reorg.normalModes`, for the registry. */
export const reorgMethods: MethodDefinition<any>[] = [
  twoSphereMethod,
  fourPointMethod,
  normalModesMethod,
];
