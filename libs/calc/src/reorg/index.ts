/** Reorganization-energy methods of this folder (`reorg.gapSamples` lives in `gap/`). */
import type { MethodDefinition } from '../core/method';
import { fourPointMethod } from './four-point/four-point';
import { twoSphereMethod } from './two-sphere/two-sphere';

/** `reorg.twoSphere` and `reorg.fourPoint`, for the registry. */
export const reorgMethods: MethodDefinition<any>[] = [twoSphereMethod, fourPointMethod];
