import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { csvCell, neutraliseCsvText, toCsv } from "../../server/lib/csv";
import { signedInClient } from "../helpers/db";
import { today, warmDigester } from "../helpers/steward-fixtures";

const app = createApp({ requestLogging: false });

// The characters that start a formula in spreadsheet programs: =, +, -, @, tab and carriage return
// (OWASP, "CSV Injection" [read]).
describe("the CSV writer", () => {
  it("when a text cell starts like a formula, then it gets a leading apostrophe and quotes", () => {
    for (const text of ["=1+1", "+SUM(A1)", "-2+3", "@cmd", "\tx", "\rx"]) {
      expect(neutraliseCsvText(text)).toBe(`'${text}`);
      expect(csvCell(text)).toBe(`"'${text}"`);
    }
    expect(csvCell('=HYPERLINK("http://x.invalid","click")')).toBe(`"'=HYPERLINK(""http://x.invalid"",""click"")"`);
  });

  it("when a text cell is ordinary, then it is left alone unless it holds a comma, quote or line break", () => {
    expect(csvCell("Stirred, then fed")).toBe('"Stirred, then fed"');
    expect(csvCell('He said "fine"')).toBe('"He said ""fine"""');
    expect(csvCell("two\nlines")).toBe('"two\nlines"');
    expect(csvCell("a - b")).toBe("a - b");
    expect(csvCell("")).toBe("");
  });

  it("when a cell is a number, date, boolean or empty, then it is written as data (a negative number is not a formula)", () => {
    expect(csvCell(-3.5)).toBe("-3.5");
    expect(csvCell(0)).toBe("0");
    expect(csvCell(Number.NaN)).toBe("");
    expect(csvCell(null)).toBe("");
    expect(csvCell(undefined)).toBe("");
    expect(csvCell(true)).toBe("true");
    expect(csvCell(new Date("2026-05-03T07:30:00Z"))).toBe("2026-05-03T07:30:00.000Z");
  });

  it("when rows are written, then there is a header line and CRLF line ends (RFC 4180)", () => {
    const csv = toCsv(
      [
        { header: "name", value: (r: { name: string; kg: number }) => r.name },
        { header: "kg", value: (r: { name: string; kg: number }) => r.kg },
      ],
      [
        { name: "Bucket", kg: 5 },
        { name: "-cold", kg: -1 },
      ],
    );
    expect(csv).toBe(`name,kg\r\nBucket,5\r\n"'-cold",-1\r\n`);
  });
});

describe("CSV exports", () => {
  it("when a steward exports readings, then notes starting like formulas are neutralised and the file downloads as CSV", async () => {
    const { digester } = await warmDigester({ temperatureC: null, ph: null });
    const steward = await signedInClient(app, { roles: ["steward"], stewardOf: [digester.id] });
    await steward.post(`/api/digesters/${digester.id}/readings`).send({
      takenAt: new Date(Date.now() - 60_000).toISOString(),
      temperatureC: -2.5,
      note: '=HYPERLINK("http://x.invalid")',
    });
    const res = await steward.get(`/api/digesters/${digester.id}/readings.csv`);
    expect(res.status).toBe(200);
    expect(res.headers["content-type"]).toBe("text/csv; charset=utf-8");
    expect(res.headers["content-disposition"]).toBe(`attachment; filename="digester-${digester.id}-readings.csv"`);
    const lines = res.text.split("\r\n");
    expect(lines[0]).toBe(
      "taken_at,temperature_c,ph,vfa_ta_ratio,titration_a_ml,titration_b_ml,gas_level_percent,drum_rise_m,gas_used_minutes,source,entered_by,note",
    );
    expect(lines[1]).toContain(",-2.5,");
    expect(lines[1]!.endsWith(`"'=HYPERLINK(""http://x.invalid"")"`)).toBe(true);
  });

  it("when a steward exports feedings, then each feeding is a row with its note neutralised", async () => {
    const { digester } = await warmDigester({ previousDailyKgVs: 10 });
    const steward = await signedInClient(app, { roles: ["steward"], stewardOf: [digester.id] });
    await steward.post(`/api/digesters/${digester.id}/feedings`).send({ freshKg: 2, note: "@SUM(1)" });
    const res = await steward.get(`/api/digesters/${digester.id}/feedings.csv?from=${today()}&to=${today()}`);
    expect(res.status).toBe(200);
    const lines = res.text.trimEnd().split("\r\n");
    expect(lines).toHaveLength(2);
    expect(lines[1]!.startsWith(`${today()},`)).toBe(true);
    expect(lines[1]!.endsWith(`"'@SUM(1)"`)).toBe(true);
  });
});
