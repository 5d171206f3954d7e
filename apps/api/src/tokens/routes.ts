import type { Router } from 'express';
import { IsString, MaxLength, Validate } from 'class-validator';
import type { CreatedApiToken } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, userIdOf } from '../http/authenticate';
import { notFound } from '../http/app-error';
import { parseBody } from '../http/validate';
import { randomToken } from '../auth/session-tokens';
import { NotBlank } from '../workspaces/workspace-dto';
import { insertToken, listTokens, revokeToken } from './token-repository';

export class TokenNameDto {
  @IsString()
  @MaxLength(100)
  @Validate(NotBlank)
  name: string;
}

export function registerTokenRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  router.get('/tokens', requireAuth, async (req, res) => {
    res.json(await listTokens(db.manager, userIdOf(req)));
  });
  /** Creates a token for scripts; the secret is in this answer only (stored hashed). */
  router.post('/tokens', requireAuth, async (req, res) => {
    const { name } = parseBody(TokenNameDto, req.body);
    const token = randomToken('gw_');
    const saved = await insertToken(db.manager, userIdOf(req), name.trim(), token);
    const body: CreatedApiToken = { ...saved, token };
    res.status(201).json(body);
  });
  router.delete('/tokens/:id', requireAuth, async (req, res) => {
    if (!(await revokeToken(db.manager, userIdOf(req), String(req.params['id']))))
      throw notFound('token');
    res.status(204).end();
  });
}
