import type { Router } from 'express';
import { calculate, serializeAnswer } from '@gapwise/calc';
import type { AppDeps } from '../http/context';
import { requireAuth } from '../http/authenticate';

export function registerCalcRoutes(router: Router, _deps: AppDeps): void {
  /**
   * The calculation contract of CALC-API.md: the body is `serializeAnswer(calculate(request))`,
   * the very bytes `gapwise calc` prints for the same request (without its newline).
   */
  router.post('/calc', requireAuth, (req, res) => {
    const answer = calculate(req.body);
    res
      .status(answer.ok ? 200 : 400)
      .type('application/json')
      .send(serializeAnswer(answer));
  });
}
