import { describe, it, expect } from "vitest";
import fc from "fast-check";
import {
  EARTH_MEAN_RADIUS_M,
  METRES_PER_DEGREE_LATITUDE,
  boundingBox,
  boxAroundM,
  boxContains,
  destinationPoint,
  haversineM,
  isValidLatLng,
} from "../../shared/domain/geo";

const latLng = fc.record({
  lat: fc.double({ min: -80, max: 80, noNaN: true }),
  lng: fc.double({ min: -179, max: 179, noNaN: true }),
});

describe("haversine distance", () => {
  it("when two points are 1° of latitude apart on a meridian, then they are 111 195 m apart", () => {
    // π/180 × 6 371 008.8 m = 111 195.08 m [derived from the GRS 80 mean radius R1, Moritz 2000, memory]
    expect(haversineM({ lat: 0, lng: 10 }, { lat: 1, lng: 10 })).toBeCloseTo(111_195.08, 1);
    expect(haversineM({ lat: 51, lng: -2 }, { lat: 52, lng: -2 })).toBeCloseTo(111_195.08, 1);
    expect(METRES_PER_DEGREE_LATITUDE).toBeCloseTo(111_195.08, 1);
  });

  it("when two points are 1° of longitude apart at 60° N, then they are half of 1° on the equator apart (cos 60° = 0.5)", () => {
    // Along a parallel the great circle is slightly shorter than the parallel arc: chord-derived value,
    // 2R·asin(cos60°·sin(0.5°)) = 55 596.3 m [derived]; the parallel arc would be 55 597.5 m.
    const d = haversineM({ lat: 60, lng: 0 }, { lat: 60, lng: 1 });
    expect(d).toBeCloseTo(2 * EARTH_MEAN_RADIUS_M * Math.asin(0.5 * Math.sin(Math.PI / 360)), 6);
    expect(d).toBeGreaterThan(55_590);
    expect(d).toBeLessThan(55_597.5);
  });

  it("when the points are antipodal, then the distance is half the circumference πR", () => {
    // πR = 20 015 114.4 m [derived]
    expect(haversineM({ lat: 0, lng: 0 }, { lat: 0, lng: 180 })).toBeCloseTo(Math.PI * EARTH_MEAN_RADIUS_M, 3);
    expect(haversineM({ lat: 90, lng: 0 }, { lat: -90, lng: 0 })).toBeCloseTo(20_015_114.4, 1);
  });

  it("is a metric on random points: zero on itself, symmetric, triangle inequality", () => {
    fc.assert(
      fc.property(latLng, latLng, latLng, (a, b, c) => {
        expect(haversineM(a, a)).toBe(0);
        expect(haversineM(a, b)).toBeCloseTo(haversineM(b, a), 6);
        expect(haversineM(a, c)).toBeLessThanOrEqual(haversineM(a, b) + haversineM(b, c) + 1e-6);
      }),
    );
  });

  it("when walking d metres on a bearing, then the haversine distance back is d", () => {
    fc.assert(
      fc.property(
        latLng,
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: 0, max: 50_000, noNaN: true }),
        (p, bearing, d) => {
          const q = destinationPoint(p, bearing, d);
          expect(haversineM(p, q)).toBeCloseTo(d, 3);
        },
      ),
    );
  });
});

describe("locations and boxes", () => {
  it("when coordinates are missing, not finite or out of range, then they are not a location", () => {
    expect(isValidLatLng(52.1, 5.1)).toBe(true);
    expect(isValidLatLng(null, 5)).toBe(false);
    expect(isValidLatLng(52, undefined)).toBe(false);
    expect(isValidLatLng(Number.NaN, 5)).toBe(false);
    expect(isValidLatLng(91, 5)).toBe(false);
    expect(isValidLatLng(52, 181)).toBe(false);
  });

  it("when given points, then the bounding box holds them all and skips invalid ones", () => {
    const box = boundingBox([
      { lat: 52.1, lng: 5.2 },
      { lat: 52.3, lng: 5.0 },
      { lat: Number.NaN, lng: 9 },
    ]);
    expect(box).toEqual({ minLat: 52.1, maxLat: 52.3, minLng: 5.0, maxLng: 5.2 });
    expect(boundingBox([])).toBeNull();
  });

  it("when a point lies within r metres of the centre, then the box around the centre contains it", () => {
    fc.assert(
      fc.property(
        latLng,
        fc.double({ min: 0, max: 360, noNaN: true }),
        fc.double({ min: 1, max: 20_000, noNaN: true }),
        fc.double({ min: 0, max: 1, noNaN: true }),
        (c, bearing, r, share) => {
          const p = destinationPoint(c, bearing, r * share);
          expect(boxContains(boxAroundM(c, r * 1.000001), p)).toBe(true);
        },
      ),
    );
  });

  it("when the radius reaches a pole, then the box spans all longitudes", () => {
    const box = boxAroundM({ lat: 89.99, lng: 10 }, 5_000);
    expect(box.minLng).toBe(-180);
    expect(box.maxLng).toBe(180);
  });
});
