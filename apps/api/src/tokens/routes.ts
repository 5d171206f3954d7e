import type { Router } from 'express';
import { IsIn, IsISO8601, IsOptional, IsString, MaxLength, Validate } from 'class-validator';
import { API_TOKEN_SCOPES, type ApiTokenScope, type CreatedApiToken } from '@gapwise/contracts';
import type { AppDeps } from '../http/context';
import { requireAuth, requireSession, userIdOf } from '../http/authenticate';
import { notFound, validationFailed } from '../http/app-error';
import { parseBody } from '../http/validate';
import { randomToken } from '../auth/session-tokens';
import { NotBlank } from '../workspaces/workspace-dto';
import { insertToken, listTokens, revokeToken } from './token-repository';

/** The longest a token may live when an expiry is given (an open-ended token is also allowed). */
export const TOKEN_MAX_DAYS = 366;

export class CreateTokenDto {
  @IsString()
  @MaxLength(100)
  @Validate(NotBlank)
  name: string;

  @IsOptional()
  @IsIn(API_TOKEN_SCOPES, { message: `must be one of ${API_TOKEN_SCOPES.join(', ')}` })
  scope?: ApiTokenScope;

  @IsOptional()
  @IsISO8601({ strict: true }, { message: 'must be a date such as 2027-01-31' })
  expiresAt?: string | null;
}

function expiryOf(raw: string | null | undefined): Date | null {
  if (raw === undefined || raw === null) return null;
  const at = new Date(raw);
  const days = (at.getTime() - Date.now()) / 86_400_000;
  if (!(days > 0))
    throw validationFailed([{ field: 'expiresAt', message: 'must be in the future' }]);
  if (days > TOKEN_MAX_DAYS)
    throw validationFailed([
      { field: 'expiresAt', message: `must be at most ${TOKEN_MAX_DAYS} days ahead` },
    ]);
  return at;
}

export function registerTokenRoutes(router: Router, deps: AppDeps): void {
  const db = deps.dataSource;
  router.get('/tokens', requireAuth, async (req, res) => {
    res.json(await listTokens(db.manager, userIdOf(req)));
  });
  /**
   * Creates a token for scripts; the secret is in this answer only (stored hashed). Only a
   * signed-in person may create one: a token cannot mint further tokens.
   */
  router.post('/tokens', requireAuth, requireSession, async (req, res) => {
    const input = parseBody(CreateTokenDto, req.body);
    const expiresAt = expiryOf(input.expiresAt);
    const token = randomToken('gw_');
    const saved = await insertToken(
      db.manager,
      userIdOf(req),
      input.name.trim(),
      token,
      input.scope ?? 'read-write',
      expiresAt,
    );
    const body: CreatedApiToken = { ...saved, token };
    res.status(201).json(body);
  });
  /** Revokes at once: the next request with the token is refused. */
  router.delete('/tokens/:id', requireAuth, async (req, res) => {
    if (!(await revokeToken(db.manager, userIdOf(req), String(req.params['id']))))
      throw notFound('token');
    res.status(204).end();
  });
}
