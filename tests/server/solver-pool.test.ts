import { afterAll, describe, expect, it } from "vitest";
import type { AssignmentInput } from "../../shared/domain/assignment";
import { auditAssignment } from "../../shared/domain/assignment";
import { destinationPoint } from "../../shared/domain/geo";
import { solveOffThread, stopSolver } from "../../server/modules/assignments/solver-pool";
import { mulberry32 } from "../../shared/random";

/** A tight invented network: 300 households around 8 digesters with 30 % spare room (deterministic). */
function tightNetwork(): AssignmentInput {
  const centre = { lat: 52.09, lng: 5.12 };
  const rnd = mulberry32(7);
  const households = Array.from({ length: 300 }, (_, i) => ({
    id: `h${i}`,
    ...destinationPoint(destinationPoint(centre, 90, rnd() * 2000), 0, rnd() * 2000),
    weeklyKg: Math.round((1 + 6 * rnd() * rnd()) * 10) / 10,
  }));
  const total = households.reduce((s, h) => s + h.weeklyKg, 0);
  const digesters = Array.from({ length: 8 }, (_, j) => ({
    id: `d${j}`,
    ...destinationPoint(destinationPoint(centre, 90, rnd() * 2000), 0, rnd() * 2000),
    weeklyRoomKg: Math.round(((total * 1.3) / 8) * 10) / 10,
    available: true,
  }));
  return { households, digesters };
}

afterAll(() => stopSolver());

describe("assignment solver on its worker thread", () => {
  it("answers with a plan that overloads nothing while the event loop keeps running", async () => {
    const input = tightNetwork();
    let ticks = 0;
    const timer = setInterval(() => ticks++, 10);
    const started = performance.now();
    const { result } = await solveOffThread(input, { timeLimitS: 10 });
    const elapsed = performance.now() - started;
    clearInterval(timer);
    expect(auditAssignment(input, result).overloadedDigesterIds).toEqual([]);
    expect(result.assignments.length + result.unplaced.length).toBe(300);
    // A solve on this thread would have blocked the timer for the whole solve: ticks would be ≤ 1.
    expect(elapsed).toBeGreaterThan(100);
    expect(ticks).toBeGreaterThan(elapsed / 10 / 4);
  }, 60_000);

  it("when the worker does not answer in time, the request gets a 503 and the next one a fresh worker", async () => {
    const input = tightNetwork();
    await expect(solveOffThread(input, { timeLimitS: 10 }, 1)).rejects.toMatchObject({
      status: 503,
      code: "scheduler_timeout",
    });
    const { result } = await solveOffThread(
      { households: input.households.slice(0, 5), digesters: input.digesters },
      { timeLimitS: 10 },
    );
    expect(result.assignments).toHaveLength(5);
  }, 60_000);
});
