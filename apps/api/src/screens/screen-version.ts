import { readFileSync } from 'node:fs';
import { REPO_ROOT } from '../config';

/**
 * Version of the software that computes screen results. Results are reused only for the same
 * input hash and this version; bump SCREEN_COMPUTE_REVISION whenever the per-row computation
 * changes without a package version change.
 */
const SCREEN_COMPUTE_REVISION = 2; // r2: kernels on the hot path; no per-row reference-electrode advice

const pkg = JSON.parse(readFileSync(`${REPO_ROOT}/package.json`, 'utf8')) as { version: string };

export const SCREEN_SOFTWARE_VERSION = `gapwise ${pkg.version}; screens r${SCREEN_COMPUTE_REVISION}`;
