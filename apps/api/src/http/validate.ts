import 'reflect-metadata';
import { plainToInstance, type ClassConstructor } from 'class-transformer';
import { validateSync, type ValidationError } from 'class-validator';
import type { RequestHandler } from 'express';
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

/** Keys that would reach an object's prototype if code ever copied the body into an object. */
const PROTOTYPE_KEYS = new Set(['__proto__', 'constructor', 'prototype']);

/** Every `__proto__`, `constructor` or `prototype` key anywhere in a JSON value, as field errors. */
export function prototypeKeys(
  value: unknown,
  path = '',
  out: FieldError[] = [],
  depth = 0,
): FieldError[] {
  if (out.length >= 20 || depth > 20 || !value || typeof value !== 'object') return out;
  if (Array.isArray(value)) {
    value.forEach((v, i) => prototypeKeys(v, path ? `${path}.${i}` : String(i), out, depth + 1));
    return out;
  }
  for (const key of Object.keys(value)) {
    const p = path ? `${path}.${key}` : key;
    if (PROTOTYPE_KEYS.has(key))
      out.push({ field: p, message: `'${key}' is not allowed as a field name` });
    else prototypeKeys((value as Record<string, unknown>)[key], p, out, depth + 1);
  }
  return out;
}

/**
 * Middleware after the JSON parser: a body carrying `__proto__`/`constructor`/`prototype` keys
 * is refused with a 400 naming the key, on every route (prototype pollution never starts).
 */
export const refusePrototypeKeys: RequestHandler = (req, _res, next) => {
  const found = prototypeKeys(req.body);
  if (found.length) throw validationFailed(found);
  next();
};

/** The type a class-validator type check asks for, by constraint name. */
const EXPECTED_TYPE: Record<string, { name: string; test: (v: unknown) => boolean }> = {
  isNumber: { name: 'a number', test: (v) => typeof v === 'number' },
  isInt: { name: 'a whole number', test: (v) => typeof v === 'number' },
  isString: { name: 'a text', test: (v) => typeof v === 'string' },
  isEmail: { name: 'a text', test: (v) => typeof v === 'string' },
  isUuid: { name: 'a text', test: (v) => typeof v === 'string' },
  isArray: { name: 'a list', test: (v) => Array.isArray(v) },
  isObject: { name: 'an object', test: (v) => !!v && typeof v === 'object' && !Array.isArray(v) },
};

const typeName = (v: unknown) =>
  v === null
    ? 'null'
    : Array.isArray(v)
      ? 'a list'
      : typeof v === 'string'
        ? 'a string'
        : typeof v === 'object'
          ? 'an object'
          : `a ${typeof v}`;

/**
 * One message naming the type when a value has the wrong JSON type ("must be a number (got a
 * string)"); range rules say nothing useful about a value of the wrong type.
 */
function wrongType(error: ValidationError): string | undefined {
  if (error.value === undefined || error.value === null) return undefined;
  for (const name of Object.keys(error.constraints ?? {})) {
    const expected = Object.hasOwn(EXPECTED_TYPE, name) ? EXPECTED_TYPE[name] : undefined;
    if (expected && !expected.test(error.value))
      return `must be ${expected.name} (got ${typeName(error.value)})`;
  }
  return undefined;
}

function flatten(errors: ValidationError[], parent = ''): FieldError[] {
  const out: FieldError[] = [];
  for (const error of errors) {
    const field = parent ? `${parent}.${error.property}` : error.property;
    const typeMessage = wrongType(error);
    if (typeMessage) out.push({ field, message: typeMessage });
    else for (const message of Object.values(error.constraints ?? {})) out.push({ field, message });
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
    // Values are read by flatten (to name a wrong type) and never put in the answer.
    validationError: { target: false, value: true },
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
