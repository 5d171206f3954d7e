/**
 * Room for labels in a drawing: curves, arrows and labels already placed mark the cells of an
 * occupancy grid, and a new label goes to the free spot nearest the point it names. Pure
 * geometry in drawing units (pixels or PDF points, y down); no DOM, no framework.
 *
 * Method: the obstacles are rasterised into cells of `cell` units (polylines sampled about every
 * cell and widened by a margin); a summed-area table then answers "is this box free?" in constant
 * time (Crow, "Summed-area tables for texture mapping", SIGGRAPH 1984, doi:10.1145/800031.808600),
 * so the grid positions of a label can be tried nearest first. Placed labels and leader lines are
 * kept as a short list beside the table, so placing one does not rebuild it.
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

/** `targetToBox(…).distance` without allocating: segment a–b (a = b for a point) to a box. */
function distanceToBox(a: Point, b: Point, x: number, y: number, w: number, h: number): number {
  let d = Math.min(pointToBox(a.x, a.y, x, y, w, h), pointToBox(b.x, b.y, x, y, w, h));
  if (a.x === b.x && a.y === b.y) return d;
  d = Math.min(d, cornerToSegment(x, y, a, b), cornerToSegment(x + w, y, a, b));
  return Math.min(d, cornerToSegment(x, y + h, a, b), cornerToSegment(x + w, y + h, a, b));
}

function pointToBox(px: number, py: number, x: number, y: number, w: number, h: number): number {
  const dx = Math.max(x - px, 0, px - x - w);
  const dy = Math.max(y - py, 0, py - y - h);
  return Math.sqrt(dx * dx + dy * dy);
}

function cornerToSegment(cx: number, cy: number, a: Point, b: Point): number {
  const dx = b.x - a.x;
  const dy = b.y - a.y;
  const t = Math.min(1, Math.max(0, ((cx - a.x) * dx + (cy - a.y) * dy) / (dx * dx + dy * dy)));
  const ex = a.x + t * dx - cx;
  const ey = a.y + t * dy - cy;
  return Math.sqrt(ex * ex + ey * ey);
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
  /** Placed labels and leader lines: checked one by one, so placing never rebuilds the table. */
  private readonly taken: Box[] = [];
  private readonly leaders: Array<readonly [Point, Point]> = [];

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
    // Samples closer than the margin's width leave no gap between their marked squares.
    const step = Math.max(0.5, Math.min(this.cell, 2 * margin));
    for (let i = 1; i < points.length; i++) {
      const a = points[i - 1];
      const b = points[i];
      if (!(Number.isFinite(a.x + a.y) && Number.isFinite(b.x + b.y))) continue;
      if (this.bothOutside(a, b, margin)) continue;
      const length = Math.sqrt((b.x - a.x) ** 2 + (b.y - a.y) ** 2);
      const steps = Math.max(1, Math.ceil(length / step));
      for (let s = 0; s <= steps; s++) {
        const x = a.x + ((b.x - a.x) * s) / steps;
        const y = a.y + ((b.y - a.y) * s) / steps;
        this.mark(x - margin, y - margin, x + margin, y + margin);
      }
    }
  }

  /** Marks the cells a box (grown by `margin`) touches. */
  addBox(box: Box, margin = 0): void {
    this.mark(
      box.x - margin,
      box.y - margin,
      box.x + box.width + margin,
      box.y + box.height + margin,
    );
  }

  /** True when the box lies inside the bounds and touches no marked cell or placed label. */
  isFree(box: Box): boolean {
    return this.freeAt(box.x, box.y, box.width, box.height);
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
    if (!best) best = this.nearestFree(target, width, height);
    if (!best) return null;
    const near = targetToBox(target, best);
    const margin = options.margin ?? 2;
    this.taken.push({
      x: best.x - margin,
      y: best.y - margin,
      width: best.width + 2 * margin,
      height: best.height + 2 * margin,
    });
    const leader = near.distance > leaderFrom ? ([near.from, near.to] as const) : null;
    if (leader) this.leaders.push(leader);
    return { box: best, distance: near.distance, leader };
  }

  /**
   * The free box nearest the target over all grid positions. Rows and columns are visited in
   * order of their gap to the target's bounding box, a lower bound of the distance, so the
   * search stops as soon as no closer box can remain.
   */
  private nearestFree(target: Target, width: number, height: number): Box | null {
    const b = this.bounds;
    const [t0, t1] = isSegment(target) ? target : [target, target];
    const level = (t0.y + t1.y) / 2;
    const rows = this.positions(b.y, b.height, height, Math.min(t0.y, t1.y), Math.max(t0.y, t1.y));
    const cols = this.positions(b.x, b.width, width, Math.min(t0.x, t1.x), Math.max(t0.x, t1.x));
    let bestX = 0;
    let bestY = 0;
    let bestScore = Infinity;
    for (let r = 0; r < rows.length; r += 2) {
      const rowGap = rows[r + 1];
      if (rowGap >= bestScore) break;
      const y = rows[r];
      for (let c = 0; c < cols.length; c += 2) {
        const colGap = cols[c + 1];
        if (rowGap * rowGap + colGap * colGap >= bestScore * bestScore) break;
        const x = cols[c];
        // Ties go to the box whose centre is level with the target (labels read sideways).
        const score =
          distanceToBox(t0, t1, x, y, width, height) + Math.abs(y + height / 2 - level) * 1e-3;
        if (score < bestScore && this.freeAt(x, y, width, height)) {
          bestScore = score;
          bestX = x;
          bestY = y;
        }
      }
    }
    return bestScore < Infinity ? { x: bestX, y: bestY, width, height } : null;
  }

  /** Grid positions of a box along one axis with their gap to [t0, t1], nearest first: [at, gap, …]. */
  private positions(from: number, span: number, size: number, t0: number, t1: number): number[] {
    const order: number[] = [];
    for (let at = from; at + size <= from + span; at += this.cell) order.push(at);
    const gap = (at: number) => Math.max(0, t0 - (at + size), at - t1);
    order.sort((p, q) => gap(p) - gap(q));
    const out: number[] = [];
    for (const at of order) out.push(at, gap(at));
    return out;
  }

  private freeAt(x: number, y: number, w: number, h: number): boolean {
    const b = this.bounds;
    if (x < b.x || y < b.y || x + w > b.x + b.width || y + h > b.y + b.height) return false;
    const c0 = Math.max(0, Math.floor((x - b.x) / this.cell));
    const r0 = Math.max(0, Math.floor((y - b.y) / this.cell));
    const c1 = Math.min(this.cols - 1, Math.ceil((x + w - b.x) / this.cell) - 1);
    const r1 = Math.min(this.rows - 1, Math.ceil((y + h - b.y) / this.cell) - 1);
    if (this.count(c0, r0, c1, r1) > 0) return false;
    for (let i = 0; i < this.taken.length; i++) {
      const t = this.taken[i];
      if (x < t.x + t.width && t.x < x + w && y < t.y + t.height && t.y < y + h) return false;
    }
    for (let i = 0; i < this.leaders.length; i++) {
      if (segmentMeetsBox(this.leaders[i][0], this.leaders[i][1], x, y, w, h)) return false;
    }
    return true;
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

  /** Marks the cells of the rectangle x0…x1 × y0…y1 (clipped to the grid). */
  private mark(x0: number, y0: number, x1: number, y1: number): void {
    const b = this.bounds;
    const c0 = Math.max(0, Math.floor((x0 - b.x) / this.cell));
    const r0 = Math.max(0, Math.floor((y0 - b.y) / this.cell));
    const c1 = Math.min(this.cols - 1, Math.ceil((x1 - b.x) / this.cell) - 1);
    const r1 = Math.min(this.rows - 1, Math.ceil((y1 - b.y) / this.cell) - 1);
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

/** Whether segment p–q meets the box (Liang–Barsky clipping of the segment to the box). */
function segmentMeetsBox(p: Point, q: Point, x: number, y: number, w: number, h: number): boolean {
  const dx = q.x - p.x;
  const dy = q.y - p.y;
  const range = { t0: 0, t1: 1 };
  return (
    clip(-dx, p.x - x, range) &&
    clip(dx, x + w - p.x, range) &&
    clip(-dy, p.y - y, range) &&
    clip(dy, y + h - p.y, range)
  );
}

/** One Liang–Barsky edge test: narrows [t0, t1]; false when the segment misses the box. */
function clip(pk: number, qk: number, range: { t0: number; t1: number }): boolean {
  if (pk === 0) return qk >= 0;
  const t = qk / pk;
  if (pk < 0) range.t0 = Math.max(range.t0, t);
  else range.t1 = Math.min(range.t1, t);
  return range.t0 <= range.t1;
}
