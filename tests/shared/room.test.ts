import { describe, expect, it } from "vitest";
import {
  ROOM_TOLERANCE_KG_VS,
  START_UP_RAMP_DAYS,
  closedPhrase,
  closedReason,
  decideWelcome,
  fitsRoom,
  householdWeeklyKg,
  nearestWithRoom,
  roomTodayKgVs,
  startUpDay,
  type RoomCandidate,
} from "../../shared/domain";

// Places about 1.1 km apart along a meridian (0.01° of latitude ≈ 1,112 m, common practice).
const here = { lat: 51.5, lng: -0.1 };
const digester = (id: number, dLat: number, roomKgVs: number, closed = false): RoomCandidate => ({
  id,
  lat: here.lat + dLat,
  lng: here.lng,
  closed,
  roomKgVs,
});

describe("roomTodayKgVs", () => {
  it("when 2.4 kg VS of budget is open and 0.9 kg VS waits, then 1.5 kg VS is left", () => {
    expect(roomTodayKgVs({ closed: false, budgetKgVs: 2.4, pendingKgVs: 0.9 })).toBeCloseTo(1.5, 10);
  });
  it("when more waits than the budget holds, then the room is 0, not negative", () => {
    expect(roomTodayKgVs({ closed: false, budgetKgVs: 1, pendingKgVs: 3 })).toBe(0);
  });
  it("when the digester is closed, then the room is 0 whatever its budget", () => {
    expect(roomTodayKgVs({ closed: true, budgetKgVs: 5, pendingKgVs: 0 })).toBe(0);
  });
});

describe("fitsRoom", () => {
  it("when a load exactly fills the room up to rounding, then it fits; a gram of VS more does not", () => {
    expect(fitsRoom(1.5 + ROOM_TOLERANCE_KG_VS / 2, 1.5)).toBe(true);
    expect(fitsRoom(1.501, 1.5)).toBe(false);
  });
});

describe("decideWelcome", () => {
  it("when the chosen digester has room, then the drop-off is welcome there today", () => {
    const chosen = digester(1, 0, 2);
    expect(decideWelcome({ chosen, all: [chosen], loadKgVs: 1, from: here })).toEqual({
      welcomed: true,
      basis: "today",
      roomKgVs: 2,
    });
  });

  it("when it is for tomorrow, then it is welcome on tomorrow's basis, whatever today's room", () => {
    const chosen = digester(1, 0, 0);
    expect(decideWelcome({ chosen, all: [chosen], loadKgVs: 1, from: here, forTomorrow: true })).toEqual({
      welcomed: true,
      basis: "tomorrow",
    });
  });

  it("when the chosen digester is short of room, then the nearest open one with room is suggested", () => {
    const chosen = digester(1, 0, 0.5);
    const far = digester(2, 0.03, 5);
    const near = digester(3, 0.01, 5);
    const closed = digester(4, 0.001, 5, true);
    const small = digester(5, 0.002, 0.5);
    const d = decideWelcome({ chosen, all: [chosen, far, near, closed, small], loadKgVs: 1, from: here });
    expect(d).toMatchObject({ welcomed: false, reason: "notEnoughRoom", roomKgVs: 0.5 });
    if (d.welcomed) throw new Error("expected a refusal");
    expect(d.alternative?.digester.id).toBe(3);
    // 0.01° of latitude on the 6,371 km mean-radius sphere = 1,112 m (derived).
    expect(d.alternative?.distanceM).toBeCloseTo(1112, -1);
  });

  it("when the chosen digester has no room at all and none other has, then the reason is noRoomLeft with no alternative", () => {
    const chosen = digester(1, 0, 0);
    const d = decideWelcome({ chosen, all: [chosen, digester(2, 0.01, 0.2)], loadKgVs: 1, from: null });
    expect(d).toEqual({ welcomed: false, basis: "today", reason: "noRoomLeft", roomKgVs: 0, alternative: null });
  });

  it("when the chosen digester is closed, then the reason is closed", () => {
    const chosen = digester(1, 0, 9, true);
    expect(decideWelcome({ chosen, all: [chosen], loadKgVs: 1, from: here })).toMatchObject({
      welcomed: false,
      reason: "closed",
      roomKgVs: 0,
    });
  });
});

describe("nearestWithRoom", () => {
  it("when the household has no place, then distances are measured from the chosen digester", () => {
    const chosen = digester(1, 0, 0, true);
    const best = nearestWithRoom(chosen, [chosen, digester(2, 0.02, 1), digester(3, -0.01, 1)], 0, null);
    expect(best?.digester.id).toBe(3);
  });
});

describe("closed reasons", () => {
  it("when a digester rests with a reason, then the phrase names its status and reason", () => {
    const closed = closedReason({ status: "resting", statusReason: "new drum" });
    expect(closed).toEqual({ status: "resting", reason: "new drum" });
    expect(closedPhrase("Larkmoor Yard", closed!)).toBe("Larkmoor Yard is resting (new drum)");
  });
  it("when a digester is active, then it has no closed reason", () => {
    expect(closedReason({ status: "active", statusReason: null })).toBeNull();
  });
  it("when an offline digester has no reason, then the phrase has none either", () => {
    expect(closedPhrase("Mill Lane", closedReason({ status: "offline", statusReason: null })!)).toBe(
      "Mill Lane is offline",
    );
  });
});

describe("startUpDay", () => {
  it("when a digester started today, then it is on start-up day 0 without a week of history", () => {
    expect(startUpDay("2026-05-01", "2026-05-01")).toEqual({ startUpDay: 0, hasWeekOfHistory: false });
  });
  it("when it is the last day of the ramp, then it is still in start-up; the day after it is not", () => {
    // START_UP_RAMP_DAYS = 42 [DOMAIN.md §2 limit 4]; day 0 is the start, so day 41 is the last.
    expect(START_UP_RAMP_DAYS).toBe(42);
    expect(startUpDay("2026-05-01", "2026-06-11")).toEqual({ startUpDay: 41, hasWeekOfHistory: true });
    expect(startUpDay("2026-05-01", "2026-06-12").startUpDay).toBeNull();
  });
  it("when the start lies ahead, then it is not in start-up yet", () => {
    expect(startUpDay("2026-05-10", "2026-05-01")).toEqual({ startUpDay: null, hasWeekOfHistory: false });
  });
});

describe("householdWeeklyKg", () => {
  const today = "2026-05-31";
  it("when a household has under 2 weeks of history, then its declared amount is used", () => {
    expect(householdWeeklyKg({ recentKg: 9, recentWeeks: 1, firstRecentDay: today, declaredWeeklyKg: 3 }, today)).toBe(
      3,
    );
  });
  it("when its history began 20 days ago, then the kg are spread over 3 weeks", () => {
    // 21 days inclusive → ceil(21 / 7) = 3 weeks (the method of README Decisions 16).
    expect(
      householdWeeklyKg({ recentKg: 12, recentWeeks: 3, firstRecentDay: "2026-05-11", declaredWeeklyKg: 3 }, today),
    ).toBe(4);
  });
  it("when its history is longer than 8 weeks, then 8 weeks are the divisor", () => {
    expect(
      householdWeeklyKg({ recentKg: 40, recentWeeks: 8, firstRecentDay: "2026-01-01", declaredWeeklyKg: 3 }, today),
    ).toBe(5);
  });
});
