import { describe, expect, it } from "vitest";
import {
  FIRST_DAY,
  IsoDateOrDateTimeSchema,
  IsoDateSchema,
  IsoDateTimeSchema,
  LAST_DAY,
  isoDate,
} from "../../shared/schemas/common";

const firstMessage = (r: { success: boolean; error?: { issues: { message: string }[] } }) =>
  r.success ? "ok" : r.error!.issues[0]!.message;

describe("the shared day schema", () => {
  it("when a day is on or inside 2000-01-01 … 2100-12-31, then it is taken as written", () => {
    for (const day of [FIRST_DAY, "2024-02-29", LAST_DAY]) expect(IsoDateSchema.parse(day)).toBe(day);
  });

  it("when a day is outside the bounds, then the message gives them", () => {
    for (const day of ["0001-01-01", "1999-12-31", "2101-01-01", "9999-12-31"]) {
      expect(firstMessage(IsoDateSchema.safeParse(day))).toBe("Give a day from 2000-01-01 to 2100-12-31.");
    }
    expect(firstMessage(isoDate("Start date").safeParse("1999-12-31"))).toBe(
      "Start date: give a day from 2000-01-01 to 2100-12-31.",
    );
  });

  it("when the text is not a calendar day or not YYYY-MM-DD, then it says which", () => {
    expect(firstMessage(IsoDateSchema.safeParse("2025-02-29"))).toBe("This is not a calendar day.");
    expect(firstMessage(IsoDateSchema.safeParse("3 May 2026"))).toBe("Give the day as YYYY-MM-DD.");
    expect(firstMessage(IsoDateSchema.safeParse(20260503))).toBe("Give the day as YYYY-MM-DD.");
  });
});

describe("the shared date-time schema", () => {
  it("when a date-time with offset is on a day inside the bounds, then it is taken", () => {
    for (const t of ["2000-01-01T00:00:00Z", "2026-05-03T08:30:00+01:00", "2100-12-31T23:59:59-12:00"]) {
      expect(IsoDateTimeSchema.parse(t)).toBe(t);
    }
  });

  it("when its day is outside the bounds or it has no offset, then it is refused", () => {
    expect(firstMessage(IsoDateTimeSchema.safeParse("0001-01-01T00:00:00Z"))).toMatch(/2000-01-01 to 2100-12-31/);
    expect(firstMessage(IsoDateTimeSchema.safeParse("2101-01-01T00:00:00+14:00"))).toMatch(/2000-01-01/);
    expect(firstMessage(IsoDateTimeSchema.safeParse("2026-05-03T08:30:00"))).toMatch(/with its offset/);
  });

  it("when a range end is a day or a date-time, then both are bounded", () => {
    expect(IsoDateOrDateTimeSchema.parse("2026-05-03")).toBe("2026-05-03");
    expect(IsoDateOrDateTimeSchema.parse("2026-05-03T08:30:00Z")).toBe("2026-05-03T08:30:00Z");
    expect(firstMessage(IsoDateOrDateTimeSchema.safeParse("0001-01-01"))).toMatch(/2000-01-01/);
    expect(firstMessage(IsoDateOrDateTimeSchema.safeParse("0001-01-01T00:00:00Z"))).toMatch(/2000-01-01/);
    expect(firstMessage(IsoDateOrDateTimeSchema.safeParse("yesterday"))).toBe(
      "Give a day as YYYY-MM-DD or a date-time with offset.",
    );
  });
});
