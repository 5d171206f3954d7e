/**
 * The one registry of calculation methods. The dispatcher, `gapwise calc --help`, the API
 * documentation and the web forms all read it, so there is no second list to keep in step.
 * It sits above every family (`core/` below them holds only what the families share), and hands
 * `uncertainty.monteCarlo` its lookup instead of being imported by it, so no import cycle runs
 * through the library (`test/lint/import-cycles.spec.ts`). Built on first use.
 */
import { analysisMethods } from '../analysis';
import { couplingMethods } from '../coupling';
import { drivingForceMethods } from '../driving-force';
import { electrodeMethods } from '../electrode';
import { evbMethods } from '../evb';
import { fitMethods } from '../fit';
import { gapMethods } from '../gap';
import { kineticsMethods } from '../kinetics';
import { quenchMethods } from '../quench';
import { rateMethods } from '../rates';
import { reorgMethods } from '../reorg';
import { transportMethods } from '../transport';
import { uncertaintyMethods } from '../uncertainty';
import { unitMethods } from '../units';
import type { InputSpec, MethodDefinition, OutputSpec, Quantity } from '../core/method';
import { allowedUnits, canonicalUnit } from '../core/units';

let byId: Map<string, MethodDefinition<any>> | undefined;

function build(): Map<string, MethodDefinition<any>> {
  const families = [
    rateMethods,
    drivingForceMethods,
    reorgMethods,
    gapMethods,
    couplingMethods,
    evbMethods,
    electrodeMethods,
    transportMethods,
    quenchMethods,
    fitMethods,
    analysisMethods,
    kineticsMethods,
    uncertaintyMethods(findMethod),
    unitMethods,
  ];
  const map = new Map<string, MethodDefinition<any>>();
  for (const family of families) {
    for (const method of family) {
      if (map.has(method.id)) throw new Error(`Duplicate calculation method id '${method.id}'.`);
      map.set(method.id, method);
    }
  }
  return map;
}

/** Every registered method, in family order. */
export function allMethods(): readonly MethodDefinition<any>[] {
  byId ??= build();
  return [...byId.values()];
}

/** The method with this id, if registered. */
export function findMethod(id: string): MethodDefinition<any> | undefined {
  byId ??= build();
  return byId.get(id);
}

/** The input's short name for people: its `label`, else its description's first phrase. */
export function inputLabel(input: InputSpec): string {
  if (input.label) return input.label;
  return input.description.split(/ \(|\.(?: |$)|; |: /)[0]!.trim();
}

export interface CatalogInput extends InputSpec {
  /** `inputLabel` of the input. */
  readonly label: string;
  /** Canonical unit ('' when unitless). */
  readonly unit: string;
  /** Units accepted in `{ value, unit }` (empty when only bare numbers are accepted). */
  readonly units: readonly string[];
}

export interface CatalogEntry {
  readonly id: string;
  readonly summary: string;
  readonly references: readonly string[];
  readonly inputs: readonly CatalogInput[];
  readonly outputs: readonly OutputSpec[];
}

const UNITLESS: ReadonlySet<Quantity> = new Set(['integer', 'string', 'array', 'object']);

/** Plain description of every method (help text, API docs, forms). */
export function methodCatalog(): CatalogEntry[] {
  return allMethods().map((method) => ({
    id: method.id,
    summary: method.summary,
    references: [...method.references],
    inputs: method.inputs.map((input) => ({
      ...input,
      label: inputLabel(input),
      unit: UNITLESS.has(input.quantity) ? '' : canonicalUnit(input.quantity),
      units: allowedUnits(input.quantity),
    })),
    outputs: [...method.outputs],
  }));
}
