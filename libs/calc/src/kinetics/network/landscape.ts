/**
 * The energy landscape of a network of states (SCIENCE.md §17): minima are the states, each
 * electron-transfer step joins its two states at its transition-state energy, and the
 * disconnectivity tree groups minima into superbasins that interconvert below a threshold.
 * References: O. M. Becker, M. Karplus, J. Chem. Phys. 1997, 106, 1495
 * (doi 10.1063/1.473299; from memory); D. J. Wales, M. A. Miller, T. R. Walsh, Nature 1998, 394,
 * 758 (doi 10.1038/29487; from memory).
 */

/** A minimum: one state at its free energy (eV). */
export interface LandscapeMinimum {
  readonly id: string;
  readonly energyEv: number;
}

/** A transition state joining two minima (by id) at `energyEv`. */
export interface LandscapeBarrier {
  readonly from: string;
  readonly to: string;
  readonly energyEv: number;
}

/** A node of the disconnectivity tree: a minimum (leaf) or a join of superbasins. */
export interface TreeNode {
  readonly id: string;
  readonly kind: 'minimum' | 'join';
  /** The minimum's energy, or the threshold at which the superbasins join (eV). */
  readonly energyEv: number;
  /** Ids of the nodes joined here (empty for a minimum). */
  readonly children: string[];
  /** Ids of every minimum below this node, in input order. */
  readonly minima: string[];
}

export interface DisconnectivityTree {
  /** Leaves first (input order), then joins in order of rising energy. */
  readonly nodes: TreeNode[];
  /** The top node of each set of minima that no barrier connects to another. */
  readonly roots: string[];
  /** At each join energy (ascending), the superbasins: minima that interconvert at or below it. */
  readonly thresholds: { readonly energyEv: number; readonly basins: string[][] }[];
}

/** Joins at energies closer than this (eV) are one join (several basins meet at one threshold). */
const SAME_THRESHOLD_EV = 1e-9;

/**
 * Builds the disconnectivity tree by merging at rising thresholds: barriers are taken in order
 * of their transition-state energy and each joins the two superbasins it connects (Kruskal's
 * order with union–find); a barrier between minima already joined adds nothing (the lower path
 * decides). Barriers with the same energy to within 1e-9 eV make one join with several children.
 * A transition state below one of its minima cannot occur for a Marcus barrier (ΔG‡ ≥ 0 from
 * either side); a join is never placed below the minima it joins.
 */
export function disconnectivityTree(
  minima: readonly LandscapeMinimum[],
  barriers: readonly LandscapeBarrier[],
): DisconnectivityTree {
  const position = new Map(minima.map((m, i) => [m.id, i]));
  const parent = minima.map((_, i) => i);
  const find = (i: number): number => {
    while (parent[i] !== i) {
      parent[i] = parent[parent[i]];
      i = parent[i];
    }
    return i;
  };
  const nodes = new Map<string, TreeNode>(
    minima.map((m) => [
      m.id,
      { id: m.id, kind: 'minimum', energyEv: m.energyEv, children: [], minima: [m.id] },
    ]),
  );
  const top = minima.map((m) => m.id); // set representative → id of its top node
  const thresholds: { energyEv: number; basins: string[][] }[] = [];
  const sorted = barriers
    .filter((b) => position.has(b.from) && position.has(b.to) && b.from !== b.to)
    .slice()
    .sort((a, b) => a.energyEv - b.energyEv);
  const order = (ids: string[]) => ids.sort((x, y) => position.get(x)! - position.get(y)!);
  let joins = 0;
  for (const barrier of sorted) {
    const a = find(position.get(barrier.from)!);
    const b = find(position.get(barrier.to)!);
    if (a === b) continue;
    const nodeA = nodes.get(top[a])!;
    const nodeB = nodes.get(top[b])!;
    const energyEv = Math.max(barrier.energyEv, nodeA.energyEv, nodeB.energyEv);
    parent[b] = a;
    const sameLevel = (n: TreeNode) =>
      n.kind === 'join' && Math.abs(n.energyEv - energyEv) <= SAME_THRESHOLD_EV;
    let merged: TreeNode;
    if (sameLevel(nodeA) || sameLevel(nodeB)) {
      // Extend the join already at this threshold instead of stacking a second one on it.
      const host = sameLevel(nodeA) ? nodeA : nodeB;
      const guest = host === nodeA ? nodeB : nodeA;
      const children = sameLevel(guest)
        ? [...host.children, ...guest.children]
        : [...host.children, guest.id];
      if (sameLevel(guest)) nodes.delete(guest.id);
      merged = { ...host, children, minima: order([...host.minima, ...guest.minima]) };
    } else {
      joins++;
      merged = {
        id: `join-${joins}`,
        kind: 'join',
        energyEv,
        children: [nodeA.id, nodeB.id],
        minima: order([...nodeA.minima, ...nodeB.minima]),
      };
    }
    nodes.set(merged.id, merged);
    top[a] = merged.id;
    const basins = new Map<number, string[]>();
    minima.forEach((m, i) => {
      const root = find(i);
      basins.set(root, [...(basins.get(root) ?? []), m.id]);
    });
    const snapshot = { energyEv, basins: [...basins.values()] };
    const last = thresholds[thresholds.length - 1];
    if (last && Math.abs(last.energyEv - energyEv) <= SAME_THRESHOLD_EV)
      thresholds[thresholds.length - 1] = snapshot;
    else thresholds.push(snapshot);
  }
  const roots = minima
    .map((_, i) => i)
    .filter((i) => find(i) === i)
    .map((i) => top[i]);
  const list = [...nodes.values()].sort(
    (x, y) =>
      (x.kind === 'minimum' ? 0 : 1) - (y.kind === 'minimum' ? 0 : 1) ||
      (x.kind === 'join' ? x.energyEv - y.energyEv : 0),
  );
  return { nodes: list, roots, thresholds };
}
