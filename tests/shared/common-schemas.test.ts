import { describe, expect, it } from "vitest";
import {
  FIRST_DAY,
  IsoDateOrDateTimeSchema,
  IsoDateSchema,
  IsoDateTimeSchema,
  LAST_DAY,
  NOTE_TEXT_MESSAGE,
  ONE_LINE_MESSAGE,
  isoDate,
  noteText,
  oneLineText,
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

describe("one-line text and note text", () => {
  const name = oneLineText("Enter a name.").trim().min(1, "Enter a name.");
  const note = noteText("The note must be text.").trim();

  it("when a name has letters from any script, spaces and punctuation, then it is taken (trimmed)", () => {
    for (const [given, kept] of [
      ["  Ada Quell ", "Ada Quell"],
      ["Zoë Ō'Brien-Ngata", "Zoë Ō'Brien-Ngata"],
      ["北野 千尋", "北野 千尋"],
      ["Ama 👩🏾‍🌾", "Ama 👩🏾‍🌾"],
    ]) {
      expect(name.parse(given)).toBe(kept);
    }
  });

  it("when a name holds any C0 or C1 control, DEL or a Unicode line separator, even at its ends, then it is refused", () => {
    const controls = [
      ...Array.from({ length: 0x20 }, (_, i) => i),
      0x7f,
      ...Array.from({ length: 0x20 }, (_, i) => 0x80 + i),
      0x2028,
      0x2029,
    ];
    for (const code of controls) {
      const ch = String.fromCharCode(code);
      expect(firstMessage(name.safeParse(`Ada${ch}Quell`)), `U+${code.toString(16)}`).toBe(ONE_LINE_MESSAGE);
      expect(firstMessage(name.safeParse(`Ada Quell${ch}`)), `U+${code.toString(16)} at the end`).toBe(
        ONE_LINE_MESSAGE,
      );
    }
  });

  it("when a note has line breaks and tabs, then they are kept; other controls are refused", () => {
    expect(note.parse("first\r\nsecond\n\tthird")).toBe("first\r\nsecond\n\tthird");
    for (const ch of ["\u0000", "\u0007", "\u000b", "\u000c", "\u001b", "\u007f", "\u0085"]) {
      expect(firstMessage(note.safeParse(`a${ch}b`)), JSON.stringify(ch)).toBe(NOTE_TEXT_MESSAGE);
    }
  });
});
