/**
 * Room for labels in a drawing: curves, arrows and labels already placed mark the cells of an
 * occupancy grid, and a new label goes to the free spot nearest the point it names. Pure
 * geometry in drawing units (pixels or PDF points, y down); no DOM, no framework.
 *
 * Method: the obstacles are rasterised into cells of `cell` units (polylines sampled every half
 * cell and widened by a margin); a summed-area table then answers "is this box free?" in constant
 * time, so every grid position of the label can be tried (Crow, "Summed-area tables for texture
 * mapping", SIGGRAPH 1984, doi:10.1145/800031.808600).
 */

export interface Box {
  readonly x: number;
  readonly y: number;
  readonly width: number;
  readonly height: number;
}

export interface Point {
  readonly x: number;
  readonly y: number;
}

/** What a label names: a point, or a segment such as an arrow (the label may sit anywhere along it). */
export type Target = Point | readonly [Point, Point];

export interface Placement {
  readonly box: Box;
  /** Distance from the target to the box; beyond `leaderFrom` a leader line should be drawn. */
  readonly distance: number;
  /** A leader line from the target to the box (nearest points of both), when one is needed. */
  readonly leader: readonly [Point, Point] | null;
}

export interface PlaceOptions {
  /** Boxes to try first, in order (e.g. beside an arrow); the first free one wins. */
  readonly preferred?: readonly Box[];
  /** A placement farther than this from the target gets a leader line; default 10. */
  readonly leaderFrom?: number;
  /** Space kept free around the placed label for later ones; default 2. */
  readonly margin?: number;
}

/** Distance from `p` to the nearest point of `b` (0 inside), and that point. */
export function nearestOnBox(p: Point, b: Box): { distance: number; point: Point } {
  const x = Math.min(Math.max(p.x, b.x), b.x + b.width);
  const y = Math.min(Math.max(p.y, b.y), b.y + b.height);
  return { distance: Math.hypot(p.x - x, p.y - y), point: { x, y } };
}

function isSegment(target: Target): target is readonly [Point, Point] {
  return Array.isArray(target);
}

/** The point of segment a–b nearest to `p`. */
function nearestOnSegment(p: Point, a: Point, b: Point): Point {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const len2 = dx * dx + dy * dy;
  const t = len2 === 0 ? 0 : Math.min(1, Math.max(0, ((p.x - a.x) * dx + (p.y - a.y) * dy) / len2));
  return { x: a.x + t * dx, y: a.y + t * dy };
}

/**
 * Distance between a target (point or segment) and a box it does not cross, with the nearest
 * points of both: for two convex shapes apart, the closest pair has a segment end or a box
 * corner as one of its points.
 */
export function targetToBox(target: Target, b: Box): { distance: number; from: Point; to: Point } {
  if (!isSegment(target)) {
    const near = nearestOnBox(target, b);
    return { distance: near.distance, from: target, to: near.point };
  }
  const [a, c] = target;
  let best = { distance: Infinity, from: a, to: a };
  for (const end of [a, c]) {
    const near = nearestOnBox(end, b);
    if (near.distance < best.distance)
      best = { distance: near.distance, from: end, to: near.point };
  }
  const corners = [
    { x: b.x, y: b.y },
    { x: b.x + b.width, y: b.y },
    { x: b.x, y: b.y + b.height },
    { x: b.x + b.width, y: b.y + b.height },
  ];
  for (const corner of corners) {
    const on = nearestOnSegment(corner, a, c);
    const d = Math.hypot(on.x - corner.x, on.y - corner.y);
    if (d < best.distance) best = { distance: d, from: on, to: corner };
  }
  return best;
}

export class LabelSpace {
  private readonly cols: number;
  private readonly rows: number;
  private readonly occupied: Uint8Array;
  private sums: Int32Array | null = null;

  constructor(
    readonly bounds: Box,
    readonly cell = 3,
  ) {
    this.cols = Math.max(1, Math.ceil(bounds.width / cell));
    this.rows = Math.max(1, Math.ceil(bounds.height / cell));
    this.occupied = new Uint8Array(this.cols * this.rows);
  }

  /** Marks the cells within `margin` of a polyline; non-finite points break the line. */
  addPolyline(points: readonly Point[], margin = 2): void {
    for (let i = 1; i < points.length; i++) {
      const a = points[i - 1];
      const b = points[i];
      if (![a.x, a.y, b.x, b.y].every(Number.isFinite)) continue;
      if (this.bothOutside(a, b, margin)) continue;
      const steps = Math.max(1, Math.ceil(Math.hypot(b.x - a.x, b.y - a.y) / (this.cell / 2)));
      for (let s = 0; s <= steps; s++) {
        const x = a.x + ((b.x - a.x) * s) / steps;
        const y = a.y + ((b.y - a.y) * s) / steps;
        this.mark({ x: x - margin, y: y - margin, width: 2 * margin, height: 2 * margin });
      }
    }
  }

  /** Marks the cells a box (grown by `margin`) touches. */
  addBox(box: Box, margin = 0): void {
    this.mark({
      x: box.x - margin,
      y: box.y - margin,
      width: box.width + 2 * margin,
      height: box.height + 2 * margin,
    });
  }

  /** True when the box lies inside the bounds and touches no marked cell. */
  isFree(box: Box): boolean {
    const b = this.bounds;
    if (box.x < b.x || box.y < b.y) return false;
    if (box.x + box.width > b.x + b.width || box.y + box.height > b.y + b.height) return false;
    const [c0, r0, c1, r1] = this.cellRange(box);
    return this.count(c0, r0, c1, r1) === 0;
  }

  /**
   * The free box of `width` × `height` nearest to `target` (a preferred box first, if free),
   * marked as taken; null when no position in the bounds is free.
   */
  place(
    target: Target,
    width: number,
    height: number,
    options: PlaceOptions = {},
  ): Placement | null {
    const leaderFrom = options.leaderFrom ?? 10;
    let best: Box | null = options.preferred?.find((p) => this.isFree(p)) ?? null;
    if (!best) {
      let bestDistance = Infinity;
      const b = this.bounds;
      const level = isSegment(target) ? (target[0].y + target[1].y) / 2 : target.y;
      for (let y = b.y; y + height <= b.y + b.height; y += this.cell) {
        for (let x = b.x; x + width <= b.x + b.width; x += this.cell) {
          const box = { x, y, width, height };
          const d = targetToBox(target, box).distance;
          // Ties go to the box whose centre is level with the target (labels read sideways).
          const score = d + Math.abs(y + height / 2 - level) * 1e-3;
          if (score < bestDistance && this.isFree(box)) {
            bestDistance = score;
            best = box;
          }
        }
      }
    }
    if (!best) return null;
    const near = targetToBox(target, best);
    this.addBox(best, options.margin ?? 2);
    const leader = near.distance > leaderFrom ? ([near.from, near.to] as const) : null;
    if (leader) this.addPolyline(leader, 1);
    return { box: best, distance: near.distance, leader };
  }

  /** Both ends beyond the same edge of the bounds: the segment cannot touch them. */
  private bothOutside(a: Point, b: Point, margin: number): boolean {
    const { x, y, width, height } = this.bounds;
    return (
      (a.x < x - margin && b.x < x - margin) ||
      (a.y < y - margin && b.y < y - margin) ||
      (a.x > x + width + margin && b.x > x + width + margin) ||
      (a.y > y + height + margin && b.y > y + height + margin)
    );
  }

  private cellRange(box: Box): [number, number, number, number] {
    const b = this.bounds;
    const c0 = Math.max(0, Math.floor((box.x - b.x) / this.cell));
    const r0 = Math.max(0, Math.floor((box.y - b.y) / this.cell));
    const c1 = Math.min(this.cols - 1, Math.ceil((box.x + box.width - b.x) / this.cell) - 1);
    const r1 = Math.min(this.rows - 1, Math.ceil((box.y + box.height - b.y) / this.cell) - 1);
    return [c0, r0, c1, r1];
  }

  private mark(box: Box): void {
    const [c0, r0, c1, r1] = this.cellRange(box);
    for (let r = r0; r <= r1; r++) {
      for (let c = c0; c <= c1; c++) this.occupied[r * this.cols + c] = 1;
    }
    this.sums = null;
  }

  /** Marked cells in columns c0…c1 and rows r0…r1 (inclusive), from the summed-area table. */
  private count(c0: number, r0: number, c1: number, r1: number): number {
    if (c1 < c0 || r1 < r0) return 0;
    const w = this.cols + 1;
    if (!this.sums) {
      const sums = new Int32Array(w * (this.rows + 1));
      for (let r = 0; r < this.rows; r++) {
        let row = 0;
        for (let c = 0; c < this.cols; c++) {
          row += this.occupied[r * this.cols + c];
          sums[(r + 1) * w + c + 1] = sums[r * w + c + 1] + row;
        }
      }
      this.sums = sums;
    }
    const s = this.sums;
    return s[(r1 + 1) * w + c1 + 1] - s[r0 * w + c1 + 1] - s[(r1 + 1) * w + c0] + s[r0 * w + c0];
  }
}
