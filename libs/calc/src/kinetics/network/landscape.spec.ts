import { describe, expect, it } from 'vitest';
import { disconnectivityTree } from './landscape';

// Hand-built landscapes: the joining energies follow from the definition of a disconnectivity
// graph (two superbasins join at the lowest barrier between them; Becker & Karplus 1997, Wales,
// Miller & Walsh 1998, both from memory), worked out by hand for each case.

describe('disconnectivityTree', () => {
  it('joins three minima at their lowest barriers, ignoring a higher barrier that closes a cycle', () => {
    const tree = disconnectivityTree(
      [
        { id: 'A', energyEv: 0 },
        { id: 'B', energyEv: 0.2 },
        { id: 'C', energyEv: 0.1 },
      ],
      [
        { from: 'A', to: 'B', energyEv: 0.5 },
        { from: 'B', to: 'C', energyEv: 0.3 },
        { from: 'A', to: 'C', energyEv: 0.9 },
      ],
    );
    // B and C interconvert above 0.3 eV; A joins them at 0.5 eV; the 0.9 eV barrier adds nothing.
    const joins = tree.nodes.filter((n) => n.kind === 'join');
    expect(joins.map((n) => [n.energyEv, n.minima])).toEqual([
      [0.3, ['B', 'C']],
      [0.5, ['A', 'B', 'C']],
    ]);
    expect(joins[1].children).toEqual(['A', joins[0].id]);
    expect(tree.roots).toEqual([joins[1].id]);
    expect(tree.thresholds).toEqual([
      { energyEv: 0.3, basins: [['A'], ['B', 'C']] },
      { energyEv: 0.5, basins: [['A', 'B', 'C']] },
    ]);
  });

  it('builds a four-minimum tree of two pairs that meet higher up', () => {
    const tree = disconnectivityTree(
      [
        { id: 'P', energyEv: -0.4 },
        { id: 'Q', energyEv: -0.1 },
        { id: 'R', energyEv: 0 },
        { id: 'S', energyEv: 0.05 },
      ],
      [
        { from: 'R', to: 'S', energyEv: 0.6 },
        { from: 'P', to: 'Q', energyEv: 0.4 },
        { from: 'Q', to: 'R', energyEv: 0.9 },
      ],
    );
    const joins = tree.nodes.filter((n) => n.kind === 'join');
    expect(joins.map((n) => [n.energyEv, n.minima])).toEqual([
      [0.4, ['P', 'Q']],
      [0.6, ['R', 'S']],
      [0.9, ['P', 'Q', 'R', 'S']],
    ]);
    expect(joins[2].children.sort()).toEqual([joins[0].id, joins[1].id].sort());
    expect(tree.roots).toHaveLength(1);
  });

  it('makes one join with three children when barriers share an energy, and keeps unjoined minima apart', () => {
    const tree = disconnectivityTree(
      [
        { id: 'A', energyEv: 0 },
        { id: 'B', energyEv: 0.1 },
        { id: 'C', energyEv: 0.2 },
        { id: 'D', energyEv: 0.3 },
      ],
      [
        { from: 'A', to: 'B', energyEv: 0.7 },
        { from: 'B', to: 'C', energyEv: 0.7 },
      ],
    );
    const joins = tree.nodes.filter((n) => n.kind === 'join');
    expect(joins).toHaveLength(1);
    expect(joins[0].children).toEqual(['A', 'B', 'C']);
    // D has no barrier (only decays, say): a root of its own.
    expect(tree.roots.sort()).toEqual([joins[0].id, 'D'].sort());
  });
});
