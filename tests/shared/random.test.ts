import { describe, expect, it } from "vitest";
import { fnv1a32, mulberry32, seededRandom } from "../../shared/random";

describe("seeded random streams", () => {
  it("when the same seed is used twice, then the same sequence comes out", () => {
    const a = mulberry32(42);
    const b = mulberry32(42);
    const c = mulberry32(43);
    const first = Array.from({ length: 20 }, () => a());
    expect(Array.from({ length: 20 }, () => b())).toEqual(first);
    expect(Array.from({ length: 20 }, () => c())).not.toEqual(first);
  });

  it("when 20,000 values are drawn, then each lies in [0, 1) and their mean is near one half", () => {
    const next = mulberry32(7);
    let sum = 0;
    for (let i = 0; i < 20_000; i++) {
      const u = next();
      expect(u).toBeGreaterThanOrEqual(0);
      expect(u).toBeLessThan(1);
      sum += u;
    }
    // Standard error of the mean of 20,000 uniforms is ≈ 0.002; 0.01 is five of them.
    expect(Math.abs(sum / 20_000 - 0.5)).toBeLessThan(0.01);
  });

  it("when streams are named, then they differ from each other and from the bare seed", () => {
    const bare = seededRandom(1).next();
    const streamA = seededRandom(1, "households").next();
    const streamB = seededRandom(1, "digesters").next();
    expect(new Set([bare, streamA, streamB]).size).toBe(3);
    expect(seededRandom(1, "households").next()).toBe(streamA);
  });

  it("when int, pick and weighted are used, then they stay within their bounds", () => {
    const r = seededRandom(9);
    const seen = new Set<number>();
    for (let i = 0; i < 500; i++) seen.add(r.int(1, 3));
    expect([...seen].sort()).toEqual([1, 2, 3]);
    expect(["x"]).toContain(r.pick(["x"]));
    for (let i = 0; i < 100; i++)
      expect(
        r.weighted([
          ["never", 0],
          ["always", 1],
        ] as const),
      ).toBe("always");
    expect(() => r.pick([])).toThrow(RangeError);
  });

  it("when a name is hashed, then FNV-1a gives its published value", () => {
    // FNV-1a 32-bit of "a" is 0xe40c292c (IETF draft-eastlake-fnv, test vectors).
    expect(fnv1a32("a")).toBe(0xe40c292c);
    expect(fnv1a32("")).toBe(0x811c9dc5);
  });
});
