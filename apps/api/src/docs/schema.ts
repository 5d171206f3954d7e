/**
 * The one set of helpers that write JSON Schema pieces for the OpenAPI description
 * (docs/openapi.ts and each area's `*-route-docs.ts`).
 */
export type Schema = Record<string, unknown>;

export const str = { type: 'string' };
export const num = { type: 'number' };
export const int = { type: 'integer' };
export const bool = { type: 'boolean' };

/** The schema, or null. */
export const nullable = (s: Schema): Schema => ({ anyOf: [s, { type: 'null' }] });

/** A reference to a named component schema; `Name[]` is an array of them. */
export const ref = (name: string): Schema =>
  name.endsWith('[]')
    ? { type: 'array', items: ref(name.slice(0, -2)) }
    : { $ref: `#/components/schemas/${name}` };

/** An object with these properties, all required unless `required` names fewer. */
export const obj = (
  properties: Record<string, Schema>,
  required: string[] = Object.keys(properties),
): Schema => ({
  type: 'object',
  properties,
  required,
});

/** An array of `items`. */
export const arr = (items: Schema): Schema => ({ type: 'array', items });
