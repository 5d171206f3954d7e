import { describe, expect, it } from 'vitest';
import { LabelSpace, nearestOnBox, targetToBox, type Box } from './label-placement';

// Expected positions are worked by hand on a 3-unit grid: a box is free when none of the cells it
// covers holds an obstacle, and the chosen box is the free one nearest the anchor.
const overlaps = (a: Box, b: Box) =>
  a.x < b.x + b.width && b.x < a.x + a.width && a.y < b.y + b.height && b.y < a.y + a.height;

describe('LabelSpace', () => {
  it('measures the distance from a point to a box (0 inside)', () => {
    const b = { x: 10, y: 10, width: 20, height: 10 };
    expect(nearestOnBox({ x: 15, y: 15 }, b)).toEqual({ distance: 0, point: { x: 15, y: 15 } });
    expect(nearestOnBox({ x: 0, y: 15 }, b)).toEqual({ distance: 10, point: { x: 10, y: 15 } });
    expect(nearestOnBox({ x: 33, y: 24 }, b).distance).toBeCloseTo(5, 12);
  });

  it('takes a free preferred box as it is, without a leader line', () => {
    const space = new LabelSpace({ x: 0, y: 0, width: 300, height: 200 });
    const preferred = { x: 106, y: 92, width: 60, height: 16 };
    const p = space.place({ x: 100, y: 100 }, 60, 16, { preferred: [preferred] })!;
    expect(p.box).toEqual(preferred);
    expect(p.leader).toBeNull();
    // The placed label is an obstacle now.
    expect(space.isFree(preferred)).toBe(false);
  });

  it('moves a label off the curves through its anchor, with a leader line when far', () => {
    const space = new LabelSpace({ x: 0, y: 0, width: 300, height: 200 });
    // A V of two straight "curves" meeting at (150, 150); everything below it is taken.
    const v = [
      { x: 0, y: 0 },
      { x: 150, y: 150 },
      { x: 300, y: 0 },
    ];
    space.addPolyline(v, 3);
    space.addBox({ x: 0, y: 150, width: 300, height: 50 });
    const beside = { x: 156, y: 142, width: 90, height: 16 };
    const p = space.place({ x: 150, y: 150 }, 90, 16, { preferred: [beside] })!;
    expect(space.isFree(beside)).toBe(false); // it lay on the right arm
    const probe = new LabelSpace({ x: 0, y: 0, width: 300, height: 200 });
    probe.addPolyline(v, 3);
    expect(probe.isFree(p.box)).toBe(true);
    // The nearest room is under an arm, beside the apex: more than the leader threshold away.
    expect(p.box.y + p.box.height).toBeLessThanOrEqual(150);
    expect(p.distance).toBeGreaterThan(10);
    expect(p.distance).toBeLessThan(40);
    expect(p.leader).toEqual([{ x: 150, y: 150 }, nearestOnBox({ x: 150, y: 150 }, p.box).point]);
  });

  it('puts a label right beside its anchor when that is free (no leader line)', () => {
    const space = new LabelSpace({ x: 0, y: 0, width: 300, height: 200 });
    space.addPolyline(
      [
        { x: 150, y: 100 },
        { x: 150, y: 190 },
      ],
      3,
    );
    const p = space.place({ x: 150, y: 145 }, 60, 14)!;
    expect(p.distance).toBeLessThanOrEqual(10);
    expect(p.leader).toBeNull();
    expect(p.box.y + p.box.height / 2).toBeCloseTo(145, -1);
  });

  it('lets a label naming an arrow sit anywhere along it, its leader from the nearest point', () => {
    const space = new LabelSpace({ x: 0, y: 0, width: 300, height: 200 });
    const arrow = [
      { x: 100, y: 20 },
      { x: 100, y: 180 },
    ] as const;
    space.addPolyline(arrow, 3);
    // Everything near the arrow's middle is taken; its lower end has room on the right.
    space.addBox({ x: 0, y: 0, width: 300, height: 150 });
    const p = space.place(arrow, 60, 14)!;
    expect(p.box.y).toBeGreaterThanOrEqual(150);
    expect(p.distance).toBeLessThanOrEqual(10); // right by the arrow's lower part: no leader
    expect(p.leader).toBeNull();
    expect(targetToBox(arrow, { x: 110, y: 190, width: 20, height: 5 })).toEqual({
      distance: Math.hypot(10, 10),
      from: { x: 100, y: 180 },
      to: { x: 110, y: 190 },
    });
  });

  it('keeps a leader line clear for later labels', () => {
    const space = new LabelSpace({ x: 0, y: 0, width: 300, height: 200 });
    const far = { x: 200, y: 150, width: 40, height: 10 };
    const p = space.place({ x: 100, y: 100 }, 40, 10, { preferred: [far] })!;
    // From the target to the box's nearest corner, (200, 150).
    expect(p.leader).toEqual([
      { x: 100, y: 100 },
      { x: 200, y: 150 },
    ]);
    expect(space.isFree({ x: 148, y: 123, width: 4, height: 4 })).toBe(false); // on the line
    expect(space.isFree({ x: 148, y: 100, width: 4, height: 4 })).toBe(true); // beside it
  });

  it('keeps two labels for the same anchor apart', () => {
    const space = new LabelSpace({ x: 0, y: 0, width: 200, height: 120 });
    space.addPolyline(
      [
        { x: 0, y: 60 },
        { x: 200, y: 60 },
      ],
      3,
    );
    const a = space.place({ x: 100, y: 60 }, 80, 14)!;
    const b = space.place({ x: 100, y: 60 }, 80, 14)!;
    expect(overlaps(a.box, b.box)).toBe(false);
    expect(a.distance).toBeLessThanOrEqual(b.distance);
  });

  it('answers null when nothing fits, and ignores non-finite points', () => {
    const space = new LabelSpace({ x: 0, y: 0, width: 60, height: 30 });
    space.addPolyline([
      { x: NaN, y: 0 },
      { x: 30, y: 15 },
    ]);
    expect(space.isFree({ x: 0, y: 0, width: 60, height: 30 })).toBe(true);
    space.addBox({ x: 0, y: 0, width: 60, height: 30 });
    expect(space.place({ x: 30, y: 15 }, 20, 10)).toBeNull();
    expect(
      new LabelSpace({ x: 0, y: 0, width: 60, height: 30 }).place({ x: 0, y: 0 }, 80, 10),
    ).toBeNull();
  });
});
