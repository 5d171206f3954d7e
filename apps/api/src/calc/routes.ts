import type { Router } from 'express';
import type { AppDeps } from '../http/context';
import { requireAuth } from '../http/authenticate';
import { computeTasks } from '../compute/compute-tasks';

/**
 * Closed forms whose cost is a fixed handful of floating-point operations whatever the inputs
 * (no sums, samples, grids or iterations): `rate.marcus` is one exp and a square root after unit
 * conversion. Handing such a request to a worker thread costs ~10× the calculation (the pool's
 * hand-off, measured by apps/api/bench/api-reads.bench.ts), so it runs on the HTTP thread.
 */
const INLINE_METHODS: ReadonlySet<string> = new Set(['rate.marcus']);
const MAX_INLINE_INPUTS = 8;

const isScalarInput = (value: unknown): boolean => {
  if (typeof value === 'number') return true;
  if (!value || typeof value !== 'object' || Array.isArray(value)) return false;
  const v = value as Record<string, unknown>;
  return (
    Object.keys(v).length <= 2 &&
    typeof v['value'] === 'number' &&
    typeof v['unit'] === 'string' &&
    v['unit'].length <= 16
  );
};

/**
 * True only for a request whose cost is bounded before it runs: an inline method, nothing but
 * `method` and `inputs`, at most a few inputs, each a number or a `{ value, unit }` pair. Anything
 * else (arrays, nested requests, unknown keys) goes to the pool and its budget.
 */
export function isBoundedClosedForm(body: unknown): boolean {
  if (!body || typeof body !== 'object' || Array.isArray(body)) return false;
  const b = body as Record<string, unknown>;
  if (typeof b['method'] !== 'string' || !INLINE_METHODS.has(b['method'])) return false;
  if (Object.keys(b).some((k) => k !== 'method' && k !== 'inputs')) return false;
  const inputs = b['inputs'];
  if (!inputs || typeof inputs !== 'object' || Array.isArray(inputs)) return false;
  const values = Object.values(inputs);
  return values.length <= MAX_INLINE_INPUTS && values.every(isScalarInput);
}

export function registerCalcRoutes(router: Router, deps: AppDeps): void {
  /**
   * The calculation contract of CALC-API.md: the body is `serializeAnswer(calculate(request))`,
   * the very bytes `gapwise calc` prints for the same request (without its newline). Computed
   * in the pool (compute/compute-pool.ts): over budget 422, pool saturated 503 — except bounded
   * closed forms (`isBoundedClosedForm`), computed here by the same task function.
   */
  router.post('/calc', requireAuth, async (req, res) => {
    const answer = isBoundedClosedForm(req.body)
      ? computeTasks.calc(req.body)
      : await deps.compute.run('calc', [req.body], {
          budget: 'interactive',
          advice:
            'Ask for less work: fewer Monte Carlo samples or points, a larger ħω, or the classical or thermal form.',
        });
    res
      .status(answer.ok ? 200 : 400)
      .type('application/json')
      .send(answer.body);
  });
}
