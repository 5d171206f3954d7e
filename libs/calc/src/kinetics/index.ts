/** Kinetic networks of several states (SCIENCE.md §17). */
import type { MethodDefinition } from '../core/method';
import { networkMethod } from './network/network';

/** `kinetics.network`, for the registry. */
export const kineticsMethods: MethodDefinition<any>[] = [networkMethod];
