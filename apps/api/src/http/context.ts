import type { DataSource } from 'typeorm';
import type { Config } from '../config';
import type { ComputePool } from '../compute/compute-pool';
import type { Mailer } from '../mail/mailer';
import type { MailQueue } from '../mail/mail-queue';
import type { ReportPdfStore } from '../reports/report-pdf-store';

/** Everything the routes and use-cases need; built once per process (or per test file). */
export interface AppDeps {
  readonly config: Config;
  readonly dataSource: DataSource;
  /** Worker threads every calculation runs in (never the thread answering HTTP). */
  readonly compute: ComputePool;
  readonly mailer: Mailer;
  /** pg-boss backed mail queue; `null` only in tests that do not send e-mail. */
  readonly queue: MailQueue | null;
  readonly log?: (message: string) => void;
  /** Object storage for generated report PDFs (S3 API); absent or null: regenerated on download. */
  readonly reportPdfStore?: ReportPdfStore | null;
}

/** Who is calling, and how they proved it. */
export interface Principal {
  readonly userId: string;
  /** `cookie` requests must carry the CSRF header on writes; bearer and API tokens need not. */
  readonly via: 'cookie' | 'bearer' | 'api-token';
  /** Session id of a JWT (binds the CSRF token); absent for API tokens. */
  readonly sid?: string;
  /** API tokens only: `read` tokens may only use safe methods. */
  readonly scope?: 'read' | 'read-write';
}

declare module 'express-serve-static-core' {
  interface Request {
    principal?: Principal;
  }
}
