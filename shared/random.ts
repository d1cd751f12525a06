/**
 * The one seeded random generator of the project: reproducible streams for the demo data,
 * the benchmarks, the rounds heuristic's perturbations and the property tests. Not for
 * anything secret (tokens come from node:crypto on the server).
 */

/**
 * mulberry32: a 32-bit generator with a 2³² period, uniform on [0, 1).
 * Source: Tommy Ettinger's public-domain mulberry32 (widely reproduced; common practice for
 * small reproducible streams).
 */
export function mulberry32(seed: number): () => number {
  let state = seed >>> 0;
  return () => {
    state = (state + 0x6d2b79f5) >>> 0;
    let t = state;
    t = Math.imul(t ^ (t >>> 15), t | 1);
    t ^= t + Math.imul(t ^ (t >>> 7), t | 61);
    return ((t ^ (t >>> 14)) >>> 0) / 4_294_967_296;
  };
}

/** FNV-1a 32-bit hash of a string, to derive one stream's seed from its name. */
export function fnv1a32(text: string): number {
  let hash = 0x811c9dc5;
  for (let i = 0; i < text.length; i++) {
    hash ^= text.charCodeAt(i);
    hash = Math.imul(hash, 0x01000193);
  }
  return hash >>> 0;
}

/** A seeded stream with the helpers callers need. */
export interface SeededRandom {
  /** Uniform on [0, 1). */
  next(): number;
  /** Uniform on [min, max). */
  range(min: number, max: number): number;
  /** Uniform integer in [min, max], both included. */
  int(min: number, max: number): number;
  /** True with the given probability. */
  chance(probability: number): boolean;
  /** One item, uniformly. Throws on an empty list. */
  pick<T>(items: readonly T[]): T;
  /** One item, with probability proportional to its weight. Throws on an empty list. */
  weighted<T>(items: readonly (readonly [T, number])[]): T;
}

/**
 * A seeded stream. Give a `stream` name to get independent streams from one seed, so that
 * changing how one part is generated leaves the others as they were.
 */
export function seededRandom(seed: number, stream?: string): SeededRandom {
  const next = mulberry32(stream === undefined ? seed : (seed ^ fnv1a32(stream)) >>> 0);
  const at = <T>(items: readonly T[], i: number): T => {
    if (items.length === 0) throw new RangeError("cannot pick from an empty list");
    return items[Math.min(i, items.length - 1)] as T;
  };
  return {
    next,
    range: (min, max) => min + (max - min) * next(),
    int: (min, max) => min + Math.floor((max - min + 1) * next()),
    chance: (probability) => next() < probability,
    pick: (items) => at(items, Math.floor(next() * items.length)),
    weighted: (items) => {
      const total = items.reduce((sum, [, weight]) => sum + weight, 0);
      let roll = next() * total;
      for (const [item, weight] of items) {
        roll -= weight;
        if (roll < 0) return item;
      }
      return at(items, items.length - 1)[0];
    },
  };
}
