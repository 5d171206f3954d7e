import type { Router } from 'express';
import type { AppDeps } from '../http/context';
import { requireAuth } from '../http/authenticate';

export function registerCalcRoutes(router: Router, deps: AppDeps): void {
  /**
   * The calculation contract of CALC-API.md: the body is `serializeAnswer(calculate(request))`,
   * the very bytes `gapwise calc` prints for the same request (without its newline). Computed
   * in the pool (compute/compute-pool.ts): over budget 422, pool saturated 503.
   */
  router.post('/calc', requireAuth, async (req, res) => {
    const answer = await deps.compute.run('calc', [req.body], {
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
