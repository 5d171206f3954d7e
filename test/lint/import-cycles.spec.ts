import { existsSync, readdirSync, readFileSync, statSync } from 'node:fs';
import { dirname, join, relative, resolve } from 'node:path';

import ts from 'typescript';
import { describe, expect, it } from 'vitest';

/**
 * The calculation core has no import cycle: `core/` is the bottom (units, inputs, the method
 * shape), the families sit on it, and `methods/` (registry, dispatcher) sits on top. A cycle makes
 * a module's exports undefined while the cycle loads, depending on which file was imported first.
 * Type-only imports are left out: they vanish when compiled, so they cannot form a load cycle.
 */
const CALC_SRC = resolve('libs/calc/src');

function sourceFiles(folder: string): string[] {
  return readdirSync(folder).flatMap((name) => {
    const path = join(folder, name);
    if (statSync(path).isDirectory()) return sourceFiles(path);
    return path.endsWith('.ts') && !path.endsWith('.spec.ts') ? [path] : [];
  });
}

/** The relative imports of one file that load a module at run time, resolved to files. */
function runtimeImports(file: string, code: string): string[] {
  const source = ts.createSourceFile(file, code, ts.ScriptTarget.ES2022, false);
  const found: string[] = [];
  for (const statement of source.statements) {
    let specifier: ts.Expression | undefined;
    if (ts.isImportDeclaration(statement)) {
      const clause = statement.importClause;
      const typeOnly =
        clause !== undefined &&
        (clause.isTypeOnly ||
          (clause.name === undefined &&
            clause.namedBindings !== undefined &&
            ts.isNamedImports(clause.namedBindings) &&
            clause.namedBindings.elements.length > 0 &&
            clause.namedBindings.elements.every((element) => element.isTypeOnly)));
      if (!typeOnly) specifier = statement.moduleSpecifier;
    } else if (ts.isExportDeclaration(statement) && !statement.isTypeOnly) {
      specifier = statement.moduleSpecifier;
    }
    if (specifier === undefined || !ts.isStringLiteral(specifier)) continue;
    if (!specifier.text.startsWith('.')) continue;
    const target = resolve(dirname(file), specifier.text);
    const candidates = [target, `${target}.ts`, join(target, 'index.ts')];
    const hit = candidates.find((path) => existsSync(path) && statSync(path).isFile());
    if (hit) found.push(hit);
  }
  return found;
}

/** Every cycle reachable in the graph, each as the list of files around it (relative paths). */
function importCycles(graph: Map<string, string[]>): string[][] {
  const cycles: string[][] = [];
  const state = new Map<string, 'open' | 'done'>();
  const stack: string[] = [];
  const visit = (file: string) => {
    state.set(file, 'open');
    stack.push(file);
    for (const next of graph.get(file) ?? []) {
      if (state.get(next) === 'open') {
        cycles.push([...stack.slice(stack.indexOf(next)), next].map((f) => relative(CALC_SRC, f)));
      } else if (!state.has(next)) {
        visit(next);
      }
    }
    stack.pop();
    state.set(file, 'done');
  };
  for (const file of graph.keys()) if (!state.has(file)) visit(file);
  return cycles;
}

function graphOf(files: Record<string, string>): Map<string, string[]> {
  return new Map(
    Object.entries(files).map(([file, code]) => [file, runtimeImports(file, code)] as const),
  );
}

describe('import cycles', () => {
  it('libs/calc has none', () => {
    const files = Object.fromEntries(
      sourceFiles(CALC_SRC).map((file) => [file, readFileSync(file, 'utf8')]),
    );
    expect(Object.keys(files).length).toBeGreaterThan(50);
    expect(importCycles(graphOf(files))).toEqual([]);
  });

  it('finds a cycle through a family and the registry, and ignores type-only imports', () => {
    // Real files of the library, with their code replaced, so the resolver follows real paths.
    const registry = join(CALC_SRC, 'methods/registry.ts');
    const family = join(CALC_SRC, 'uncertainty/index.ts');
    const outputs = join(CALC_SRC, 'methods/method-outputs.ts');
    const cyclic = graphOf({
      [registry]: "import { uncertaintyMethods } from '../uncertainty';",
      [family]: "export { findMethod } from '../methods/registry';",
    });
    expect(importCycles(cyclic)).toEqual([
      ['methods/registry.ts', 'uncertainty/index.ts', 'methods/registry.ts'],
    ]);
    const typeOnly = graphOf({
      [outputs]: "import type { MonteCarloOutputs } from '../uncertainty';",
      [family]: "import { type MethodOutputs } from '../methods/method-outputs';",
    });
    expect(importCycles(typeOnly)).toEqual([]);
  });
});
