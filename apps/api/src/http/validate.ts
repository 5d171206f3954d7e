import 'reflect-metadata';
import { plainToInstance, type ClassConstructor } from 'class-transformer';
import { validateSync, type ValidationError } from 'class-validator';
import { validationFailed } from './app-error';

type FieldError = { field: string; message: string };

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;

/**
 * Finds strings PostgreSQL cannot store (NUL characters, lone UTF-16 surrogates) anywhere in a
 * JSON value, keys included, so they become a 400 instead of a database error.
 */
export function unstorableStrings(
  value: unknown,
  path = '',
  out: FieldError[] = [],
  depth = 0,
): FieldError[] {
  if (out.length >= 20) return out;
  if (depth > 20) {
    out.push({ field: path || '(body)', message: 'is nested too deeply' });
    return out;
  }
  const bad = (s: string) => s.includes('\u0000') || LONE_SURROGATE.test(s);
  if (typeof value === 'string') {
    if (bad(value))
      out.push({ field: path || '(body)', message: 'contains characters that cannot be stored' });
  } else if (Array.isArray(value)) {
    value.forEach((v, i) =>
      unstorableStrings(v, path ? `${path}.${i}` : String(i), out, depth + 1),
    );
  } else if (value && typeof value === 'object') {
    for (const [k, v] of Object.entries(value)) {
      const p = path ? `${path}.${k}` : k;
      if (bad(k)) out.push({ field: p, message: 'has a name that cannot be stored' });
      else unstorableStrings(v, p, out, depth + 1);
    }
  }
  return out;
}

function flatten(errors: ValidationError[], parent = ''): FieldError[] {
  const out: FieldError[] = [];
  for (const error of errors) {
    const field = parent ? `${parent}.${error.property}` : error.property;
    for (const message of Object.values(error.constraints ?? {})) out.push({ field, message });
    if (error.children?.length) out.push(...flatten(error.children, field));
  }
  return out;
}

/**
 * Turns a JSON body into a validated DTO instance (whitelist, forbidNonWhitelisted), or throws
 * a 400 `validation-failed` listing every refused field.
 */
export function parseBody<T extends object>(dto: ClassConstructor<T>, body: unknown): T {
  if (body === null || typeof body !== 'object' || Array.isArray(body)) {
    throw validationFailed([{ field: '(body)', message: 'must be a JSON object' }]);
  }
  const unstorable = unstorableStrings(body);
  if (unstorable.length) throw validationFailed(unstorable);
  const instance = plainToInstance(dto, body, { enableImplicitConversion: false });
  const errors = validateSync(instance, {
    whitelist: true,
    forbidNonWhitelisted: true,
    forbidUnknownValues: true,
    validationError: { target: false, value: false },
  });
  if (errors.length) throw validationFailed(flatten(errors));
  return instance;
}

const UUID = /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i;

/** True for a syntactically valid UUID (ids that are not UUIDs answer 404 without a query). */
export function isUuid(value: unknown): value is string {
  return typeof value === 'string' && UUID.test(value);
}

/** Reads an optional integer query parameter within bounds. */
export function queryInt(
  value: unknown,
  field: string,
  fallback: number,
  min: number,
  max: number,
  errors: FieldError[],
): number {
  if (value === undefined || value === '') return fallback;
  const n = typeof value === 'string' && /^-?\d+$/.test(value) ? Number(value) : NaN;
  if (!Number.isSafeInteger(n) || n < min || n > max) {
    errors.push({ field, message: `must be an integer from ${min} to ${max}` });
    return fallback;
  }
  return n;
}

/** Reads an optional string query parameter (a repeated parameter is refused). */
export function queryString(
  value: unknown,
  field: string,
  errors: FieldError[],
  maxLength = 200,
): string | undefined {
  if (value === undefined || value === '') return undefined;
  if (typeof value !== 'string' || value.length > maxLength || unstorableStrings(value).length) {
    errors.push({ field, message: `must be one text value of at most ${maxLength} characters` });
    return undefined;
  }
  return value;
}
