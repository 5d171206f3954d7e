/**
 * The built-in solvent table of screens; it lives in `@gapwise/contracts` (libs/contracts/src/
 * solvents.ts, with its sources) so the pair editor offers the same values.
 */
export { SOLVENTS, findSolvent, type Solvent } from '@gapwise/contracts';
