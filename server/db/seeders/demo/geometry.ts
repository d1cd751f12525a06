/** Plane geometry in metres, for drawing the invented map and placing homes along its streets. */
import { at } from "./numbers";

/** x east, y north, metres from the neighbourhood's centre. */
export type Xy = readonly [x: number, y: number];

export const dist = (a: Xy, b: Xy): number => Math.hypot(a[0] - b[0], a[1] - b[1]);

function segments(points: readonly Xy[]): [Xy, Xy][] {
  const out: [Xy, Xy][] = [];
  for (let i = 1; i < points.length; i++) out.push([at(points, i - 1), at(points, i)]);
  return out;
}

export function pathLength(points: readonly Xy[]): number {
  return segments(points).reduce((sum, [a, b]) => sum + dist(a, b), 0);
}

/** Point at distance `s` along a polyline, with the unit direction of travel there. */
export function pointAlong(points: readonly Xy[], s: number): { point: Xy; dir: Xy } {
  let left = s;
  const segs = segments(points);
  for (const [a, b] of segs) {
    const len = dist(a, b);
    if (left <= len) {
      const t = left / len;
      return {
        point: [a[0] + (b[0] - a[0]) * t, a[1] + (b[1] - a[1]) * t],
        dir: [(b[0] - a[0]) / len, (b[1] - a[1]) / len],
      };
    }
    left -= len;
  }
  const [a, b] = at(segs, segs.length - 1);
  const len = dist(a, b);
  return { point: b, dir: [(b[0] - a[0]) / len, (b[1] - a[1]) / len] };
}

function distToSegment(p: Xy, a: Xy, b: Xy): number {
  const dx = b[0] - a[0];
  const dy = b[1] - a[1];
  const t = Math.max(0, Math.min(1, ((p[0] - a[0]) * dx + (p[1] - a[1]) * dy) / (dx * dx + dy * dy)));
  return dist(p, [a[0] + dx * t, a[1] + dy * t]);
}

export function distToPath(p: Xy, points: readonly Xy[]): number {
  return Math.min(...segments(points).map(([a, b]) => distToSegment(p, a, b)));
}

export function insidePolygon(p: Xy, ring: readonly Xy[]): boolean {
  let inside = false;
  for (let i = 0, j = ring.length - 1; i < ring.length; j = i++) {
    const [xi, yi] = at(ring, i);
    const [xj, yj] = at(ring, j);
    if (yi > p[1] !== yj > p[1] && p[0] < ((xj - xi) * (p[1] - yi)) / (yj - yi) + xi) inside = !inside;
  }
  return inside;
}

/** Where two streets meet: a shared vertex or crossing; throws if they do not meet within 3 m. */
export function junction(a: readonly Xy[], b: readonly Xy[]): Xy {
  for (const [p1, p2] of segments(a)) {
    for (const [q1, q2] of segments(b)) {
      const r: Xy = [p2[0] - p1[0], p2[1] - p1[1]];
      const s: Xy = [q2[0] - q1[0], q2[1] - q1[1]];
      const denom = r[0] * s[1] - r[1] * s[0];
      if (Math.abs(denom) < 1e-9) continue;
      const qp: Xy = [q1[0] - p1[0], q1[1] - p1[1]];
      const t = (qp[0] * s[1] - qp[1] * s[0]) / denom;
      const u = (qp[0] * r[1] - qp[1] * r[0]) / denom;
      const eps = 1e-6;
      if (t >= -eps && t <= 1 + eps && u >= -eps && u <= 1 + eps) return [p1[0] + r[0] * t, p1[1] + r[1] * t];
    }
  }
  let best: { gap: number; point: Xy } = { gap: Infinity, point: [0, 0] };
  for (const p of a) {
    const gap = distToPath(p, b);
    if (gap < best.gap) best = { gap, point: p };
  }
  for (const p of b) {
    const gap = distToPath(p, a);
    if (gap < best.gap) best = { gap, point: p };
  }
  if (best.gap > 3) throw new Error("demo data: block streets do not meet");
  return best.point;
}
