import { describe, expect, it } from "vitest";
import { type CollectionRoundsInput, planCollectionRounds } from "../../shared/domain/rounds";
import { destinationPoint } from "../../shared/domain/geo";
import { planMessageWords, unplacedStopWords } from "../../server/modules/rounds/rounds.words";

// Points on one meridian: distances along it are the metres given.
const origin = { lat: 52.09, lng: 5.12 };
const onLine = (m: number) => destinationPoint(origin, 0, m);
const noNames = { volunteer: () => undefined, digester: () => undefined };

/** The planner's codes for `input`, turned into the coordinator's words. */
function words(input: CollectionRoundsInput, options = {}) {
  const plan = planCollectionRounds(input, options);
  return {
    unplaced: Object.fromEntries(plan.unplacedStops.map((u) => [u.householdId, unplacedStopWords(u, u.householdId)])),
    messages: plan.messages.map((m) => planMessageWords(m, noNames)),
  };
}

describe("rounds words: why a request was left out", () => {
  it("when a request is heavier than any bike, then the words name its load and the largest bike", () => {
    const out = words({
      stops: [
        { householdId: "Heavy house", ...onLine(150), loadKg: 30 },
        { householdId: "No map", lat: null, lng: null, loadKg: 2 },
        { householdId: "Broken", ...onLine(120), loadKg: Number.NaN },
      ],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 20 }],
      digesters: [{ id: "D", ...onLine(400), roomKg: 100 }],
    });
    expect(out.unplaced["Heavy house"]).toBe(
      "Heavy house: more buckets (30 kg) than any volunteer's cargo bike can carry (at most 20 kg); split it over two days.",
    );
    expect(out.unplaced["No map"]).toMatch(/^No map: the household has no location on the map/);
    expect(out.unplaced["Broken"]).toBe("Broken: the request has no valid number of buckets.");
    expect(out.messages).toEqual(["3 collections could not be planned; see the list for the reasons."]);
  });

  it("when the only digester with room is beyond the cap, then the words give both caps in km", () => {
    // Stop at 100 m, digester at 6,100 m: a 6 km last leg, over the 5 km default [derived].
    const input: CollectionRoundsInput = {
      stops: [{ householdId: "Far house", ...onLine(100), loadKg: 2 }],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 10 }],
      digesters: [{ id: "far", ...onLine(6100), roomKg: 100 }],
    };
    expect(words(input).unplaced["Far house"]).toMatch(
      /^Far house: no digester with room can be reached from it, riding at most 5 km between stops and 5 km to the digester;/,
    );
    expect(words(input, { maxLegM: 2500 }).unplaced["Far house"]).toMatch(/at most 2\.5 km between stops and 5 km/);
  });

  it("when the near digester's room goes to other rounds, then the words say so; when none has room at all, they give the most room", () => {
    // Four 4 kg stops, one 4 kg bike, one digester with 8 kg: two rounds fit, two stops wait [derived].
    const taken = words({
      stops: [100, 200, 300, 350].map((m, i) => ({ householdId: `s${i}`, ...onLine(m), loadKg: 4 })),
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 4 }],
      digesters: [{ id: "D", ...onLine(400), roomKg: 8 }],
    });
    const waiting = Object.values(taken.unplaced);
    expect(waiting).toHaveLength(2);
    for (const w of waiting)
      expect(w).toMatch(
        /the other rounds of this date use the room left at the digesters within 5 km, or the stops it would be reached through;/,
      );
    const full = words({
      stops: [{ householdId: "Big", ...onLine(100), loadKg: 9 }],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 10 }],
      digesters: [{ id: "D", ...onLine(400), roomKg: 6.25 }],
    });
    expect(full.unplaced["Big"]).toBe(
      "Big: no digester has room for 9 kg on this date (at most 6.3 kg); plan it another day.",
    );
    expect(full.messages).toEqual(["1 collection could not be planned; see the list for the reason."]);
  });

  it("when no volunteer reaches a stop, then the words give the cap; when there is no volunteer at all, they say where to add one", () => {
    const far = words({
      stops: [{ householdId: "Out of town", ...onLine(40_000), loadKg: 2 }],
      volunteers: [{ id: "v", ...onLine(0), bikeLoadKg: 40 }],
      digesters: [{ id: "D", ...onLine(40_300), roomKg: 100 }],
    });
    expect(far.unplaced["Out of town"]).toMatch(
      /^Out of town: no volunteer with a big enough cargo bike can reach it, riding at most 5 km from their start or between stops;/,
    );
    const nobody = words({
      stops: [{ householdId: "Alone", ...onLine(100), loadKg: 2 }],
      volunteers: [],
      digesters: [{ id: "D", ...onLine(400), roomKg: 100 }],
    });
    expect(nobody.unplaced["Alone"]).toMatch(
      /no volunteer with a cargo bike is available; mark someone as a volunteer/,
    );
    expect(nobody.messages[0]).toBe("No volunteer with a cargo bike is available for these collections.");
  });

  it("when a volunteer or a digester has no valid location, then the note names them, or says 'A volunteer' without a name", () => {
    const plan = planCollectionRounds({
      stops: [{ householdId: "s", ...onLine(100), loadKg: 2 }],
      volunteers: [
        { id: "7", lat: Number.NaN, lng: 5, bikeLoadKg: 10 },
        { id: "8", ...onLine(0), bikeLoadKg: 10 },
      ],
      digesters: [
        { id: "3", lat: 95, lng: 5, roomKg: 10 },
        { id: "4", ...onLine(400), roomKg: 10 },
      ],
    });
    const names = { volunteer: (id: string) => (id === "7" ? "Femi" : undefined), digester: () => "Canal Street" };
    expect(plan.messages.map((m) => planMessageWords(m, names))).toEqual([
      "Femi has no valid start point or bike load; left out of the rounds.",
      "Canal Street has no valid location on the map; no round ends there.",
    ]);
    expect(planMessageWords({ code: "volunteerLeftOut", volunteerId: "9" }, noNames)).toMatch(/^A volunteer has/);
    expect(unplacedStopWords({ householdId: "1", loadKg: 0 as never, reason: "invalidLoad" }, undefined)).toMatch(
      /^A request: /,
    );
  });
});
