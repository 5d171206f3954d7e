/**
 * Geometry of the cascade pictures (issue 17), shared by the web page and, later, the PDF:
 * population curves on a log time axis, the state-energy diagram and the energy landscape
 * (disconnectivity) tree. Pure functions: numbers in, coordinates out (SVG user units, y down).
 */

export interface PlotBox {
  readonly width: number;
  readonly height: number;
  readonly left: number;
  readonly right: number;
  readonly top: number;
  readonly bottom: number;
}

/** One polyline per state: `M x,y L x,y …` over log10 t (x) and population 0–1 (y). */
export function populationPaths(
  timesS: readonly number[],
  populations: Readonly<Record<string, readonly number[]>>,
  box: PlotBox,
): { paths: Record<string, string>; decades: { x: number; exponent: number }[] } {
  const logs = timesS.map(Math.log10);
  const lo = Math.floor(Math.min(...logs));
  const hi = Math.ceil(Math.max(...logs));
  const x = (l: number) =>
    box.left + ((l - lo) / (hi - lo || 1)) * (box.width - box.left - box.right);
  const y = (p: number) => box.top + (1 - p) * (box.height - box.top - box.bottom);
  const paths: Record<string, string> = {};
  for (const [id, values] of Object.entries(populations)) {
    paths[id] = values
      .map((p, i) => `${i === 0 ? 'M' : 'L'}${x(logs[i]).toFixed(1)},${y(p).toFixed(1)}`)
      .join(' ');
  }
  const decades: { x: number; exponent: number }[] = [];
  for (let e = lo; e <= hi; e++) decades.push({ x: x(e), exponent: e });
  return { paths, decades };
}

export interface LevelInput {
  readonly id: string;
  readonly energy: number;
}

export interface Level {
  readonly id: string;
  readonly x1: number;
  readonly x2: number;
  readonly y: number;
}

/**
 * The state-energy diagram: one horizontal level per state at its energy; states that would
 * overlap (within 6 % of the energy span) go side by side in columns. With `columnPerState`,
 * every state gets its own column in the order given (the page orders them ground → excited →
 * charge-separated, so the steps read left to right).
 */
export function energyLevels(
  states: readonly LevelInput[],
  box: PlotBox,
  options: { readonly columnPerState?: boolean } = {},
): {
  levels: Level[];
  y: (energy: number) => number;
} {
  const energies = states.map((s) => s.energy);
  const lo = Math.min(0, ...energies);
  const hi = Math.max(...energies);
  const span = hi - lo || 1;
  const y = (e: number) => box.top + (1 - (e - lo) / span) * (box.height - box.top - box.bottom);
  const columns: number[] = [];
  const sorted = states.map((s, i) => ({ s, i })).sort((a, b) => a.s.energy - b.s.energy);
  const placed: { energy: number; column: number }[] = [];
  for (const { s, i } of sorted) {
    if (options.columnPerState) {
      columns[i] = i;
      continue;
    }
    let column = 0;
    while (placed.some((p) => p.column === column && Math.abs(p.energy - s.energy) < 0.06 * span))
      column++;
    placed.push({ energy: s.energy, column });
    columns[i] = column;
  }
  const count = Math.max(1, ...columns.map((c) => c + 1));
  const width = (box.width - box.left - box.right) / count;
  return {
    y,
    levels: states.map((s, i) => ({
      id: s.id,
      x1: box.left + columns[i] * width + 0.15 * width,
      x2: box.left + (columns[i] + 0.85) * width,
      y: y(s.energy),
    })),
  };
}

export interface TreeInputNode {
  readonly id: string;
  readonly kind: 'minimum' | 'join';
  readonly energy: number;
  readonly children: readonly string[];
}

/**
 * The disconnectivity tree drawn the usual way: leaves (minima) spread along x in the order of
 * a depth-first walk from each root, a join at the mean x of its children and at its energy;
 * each edge is a vertical line from a child up to the join's energy and a horizontal bar there.
 */
export function disconnectivityLayout(
  nodes: readonly TreeInputNode[],
  roots: readonly string[],
  box: PlotBox,
): {
  points: Record<string, { x: number; y: number }>;
  segments: { x1: number; y1: number; x2: number; y2: number }[];
  y: (energy: number) => number;
} {
  const byId = new Map(nodes.map((n) => [n.id, n]));
  const energies = nodes.map((n) => n.energy);
  const lo = Math.min(...energies);
  const hi = Math.max(...energies);
  const span = hi - lo || 1;
  const y = (e: number) => box.top + (1 - (e - lo) / span) * (box.height - box.top - box.bottom);
  const leaves: string[] = [];
  const walk = (id: string) => {
    const n = byId.get(id);
    if (!n) return;
    if (n.children.length === 0) leaves.push(id);
    else n.children.forEach(walk);
  };
  roots.forEach(walk);
  const step = (box.width - box.left - box.right) / Math.max(1, leaves.length);
  const points: Record<string, { x: number; y: number }> = {};
  leaves.forEach((id, i) => {
    points[id] = { x: box.left + (i + 0.5) * step, y: y(byId.get(id)!.energy) };
  });
  const segments: { x1: number; y1: number; x2: number; y2: number }[] = [];
  const place = (id: string): { x: number; y: number } => {
    if (points[id]) return points[id];
    const n = byId.get(id)!;
    const kids = n.children.map(place);
    const at = { x: kids.reduce((s, k) => s + k.x, 0) / kids.length, y: y(n.energy) };
    points[id] = at;
    for (const k of kids) segments.push({ x1: k.x, y1: k.y, x2: k.x, y2: at.y });
    const xs = kids.map((k) => k.x);
    segments.push({ x1: Math.min(...xs), y1: at.y, x2: Math.max(...xs), y2: at.y });
    return at;
  };
  roots.forEach(place);
  return { points, segments, y };
}
