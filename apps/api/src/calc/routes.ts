import type { Router } from 'express';
import type { AppDeps } from '../http/context';
import { requireAuth } from '../http/authenticate';

const ADVICE =
  'Ask for less work: fewer Monte Carlo samples or points, a larger ħω, or the classical or thermal form.';
const RUN_OPTIONS = { budget: 'interactive', advice: ADVICE } as const;

export function registerCalcRoutes(router: Router, deps: AppDeps): void {
  /**
   * The calculation contract of CALC-API.md: the body is `serializeAnswer(calculate(request))`,
   * the very bytes `gapwise calc` prints for the same request (without its newline). Every
   * request, however small, is computed in the pool (compute/compute-pool.ts): over budget 422,
   * pool saturated 503. The thread that answers HTTP never calculates (issue 12); the pool's
   * round trip is kept small instead (apps/api/bench/api-reads.bench.ts).
   */
  router.post('/calc', requireAuth, async (req, res) => {
    const answer = await deps.compute.run('calc', [req.body], RUN_OPTIONS);
    res
      .status(answer.ok ? 200 : 400)
      .type('application/json')
      .send(answer.body);
  });
}
