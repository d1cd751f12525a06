import { describe, expect, it } from "vitest";
import { createApp } from "../../server/app";
import { signedInClient, sql, type ApiClient } from "../helpers/db";
import { warmDigester } from "../helpers/steward-fixtures";

const app = createApp({ requestLogging: false });

/** ISO timestamps one minute apart, starting `daysAgo` days before now (so never in the future). */
function minuteStamps(count: number, daysAgo = 40): string[] {
  const start = Math.floor(Date.now() / 1000) * 1000 - daysAgo * 86_400_000;
  return Array.from({ length: count }, (_, i) => new Date(start + i * 60_000).toISOString().replace(".000Z", "Z"));
}

const uploadCount = async (digesterId: number) =>
  Number(
    (
      await sql<{ n: string }>(`SELECT count(*) AS n FROM readings WHERE digester_id = $1 AND source = 'upload'`, [
        digesterId,
      ])
    )[0]!.n,
  );

async function setUp() {
  const { digester } = await warmDigester({ temperatureC: null, ph: null });
  const steward = await signedInClient(app, { roles: ["steward"], stewardOf: [digester.id] });
  return { digester, steward };
}

function upload(client: ApiClient, digesterId: number, content: string | Buffer, field = "file") {
  return client
    .post(`/api/digesters/${digesterId}/readings/import`)
    .attach(field, Buffer.isBuffer(content) ? content : Buffer.from(content, "utf8"), {
      filename: "sensor-log.csv",
      contentType: "text/csv",
    });
}

describe("uploading a sensor log", () => {
  it("when a steward uploads a good file, then every row is imported as an upload reading and the summary says so", async () => {
    const { digester, steward } = await setUp();
    const [a, b, c] = minuteStamps(3);
    const csv = `timestamp,temperature_c,ph,gas_level_percent\n${a},31.2,7.1,40\n${b},31.4,,42.5\n${c},-2.5,6.9,\n`;
    const res = await upload(steward, digester.id, csv);
    expect(res.status).toBe(200);
    expect(res.body).toEqual({
      imported: 3,
      skippedDuplicates: 0,
      rows: 3,
      from: new Date(a!).toISOString(),
      to: new Date(c!).toISOString(),
    });
    const rows = await sql<{
      temperature_c: string;
      ph: string | null;
      gas_level_percent: string | null;
      person_id: number;
    }>(
      `SELECT temperature_c, ph, gas_level_percent, person_id FROM readings WHERE digester_id = $1 AND source = 'upload' ORDER BY taken_at`,
      [digester.id],
    );
    expect(
      rows.map((r) => [
        Number(r.temperature_c),
        r.ph === null ? null : Number(r.ph),
        r.gas_level_percent === null ? null : Number(r.gas_level_percent),
      ]),
    ).toEqual([
      [31.2, 7.1, 40],
      [31.4, null, 42.5],
      [-2.5, 6.9, null],
    ]);
    expect(rows.every((r) => r.person_id === steward.person.id)).toBe(true);
  });

  it("when the same rows are uploaded again, then none is duplicated and the summary counts them as skipped", async () => {
    const { digester, steward } = await setUp();
    const stamps = minuteStamps(4);
    const first = `timestamp,temperature_c\n${stamps
      .slice(0, 3)
      .map((t, i) => `${t},${30 + i}`)
      .join("\n")}\n`;
    expect((await upload(steward, digester.id, first)).body).toMatchObject({ imported: 3, skippedDuplicates: 0 });
    expect((await upload(steward, digester.id, first)).body).toMatchObject({ imported: 0, skippedDuplicates: 3 });
    // Overlapping: two already there, two new (one of them twice in the file).
    const overlap = `temperature_c,timestamp\n30,${stamps[1]}\n31,${stamps[2]}\n33,${stamps[3]}\n33,${stamps[3]}\n`;
    expect((await upload(steward, digester.id, overlap)).body).toMatchObject({
      imported: 1,
      skippedDuplicates: 3,
      rows: 4,
    });
    expect(await uploadCount(digester.id)).toBe(4);
  });

  it("when one file has two rows for the same moment with different values, then it is refused naming both lines and nothing is written", async () => {
    const { digester, steward } = await setUp();
    const [a, b] = minuteStamps(2);
    // The same instant written twice, once in UTC and once at +01:00.
    const sameAsB = new Date(new Date(b!).getTime() + 3_600_000).toISOString().replace(".000Z", "+01:00");
    const csv = `timestamp,temperature_c,ph\n${a},30,7\n${b},31.2,7.1\n${a},30.0,7.00\n${sameAsB},31.4,7.1\n`;
    const res = await upload(steward, digester.id, csv);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({
      code: "csv_conflict",
      fields: { line: "5", otherLine: "3", column: "1", columnName: "timestamp" },
    });
    expect(res.body.error.message).toMatch(/^Line 5, column 1 \(timestamp\): /);
    expect(res.body.error.message).toContain("line 3");
    expect(res.body.error.message).toContain("temperature_c 31.2 on line 3, 31.4 here");
    expect(await uploadCount(digester.id)).toBe(0);
  });

  it("when one file repeats a row with the same moment and the same values, then it is imported once and the repeat is counted as skipped", async () => {
    const { digester, steward } = await setUp();
    const [a, b] = minuteStamps(2);
    const aAtPlusOne = new Date(new Date(a!).getTime() + 3_600_000).toISOString().replace(".000Z", "+01:00");
    const csv = `timestamp,temperature_c,ph,gas_level_percent\n${a},30.5,7,\n${b},31,7.1,40\n${aAtPlusOne},30.50,7.0,\n`;
    const res = await upload(steward, digester.id, csv);
    expect(res.status).toBe(200);
    expect(res.body).toMatchObject({ imported: 2, skippedDuplicates: 1, rows: 3 });
    expect(await uploadCount(digester.id)).toBe(2);
  });

  it("when the file has the columns in another order, quoted values, CRLF line ends and blank lines, then it is read", async () => {
    const { digester, steward } = await setUp();
    const [a, b] = minuteStamps(2);
    const csv = `"temperature_c","timestamp"\r\n"30.5","${a}"\r\n\r\n29,${b}\r\n`;
    const res = await upload(steward, digester.id, csv);
    expect(res.status).toBe(200);
    expect(res.body.imported).toBe(2);
  });

  const [t1, t2] = minuteStamps(2);
  const future = new Date(Date.now() + 2 * 3_600_000).toISOString();
  // [name, file, status, code, line, column]
  const bad: [string, string | Buffer, number, string, number, number | undefined][] = [
    ["semicolons between columns", `timestamp;temperature_c\n${t1};21,5\n`, 400, "csv_delimiter", 1, 1],
    ["semicolons on a data line", `timestamp,temperature_c\n${t1},21.5\n${t2};22\n`, 400, "csv_delimiter", 3, 1],
    [
      "a UTF-8 byte-order mark",
      Buffer.concat([Buffer.from([0xef, 0xbb, 0xbf]), Buffer.from(`timestamp,temperature_c\n${t1},21\n`)]),
      400,
      "csv_bom",
      1,
      1,
    ],
    ["no header line", `${t1},21\n${t2},22\n`, 400, "csv_header_missing", 1, undefined],
    ["a header without temperature_c", `timestamp,ph\n${t1},7\n`, 400, "csv_header_missing", 1, undefined],
    [
      "a duplicate header column",
      `timestamp,temperature_c,temperature_c\n${t1},21,21\n`,
      400,
      "csv_header_duplicate",
      1,
      3,
    ],
    [
      "the header repeated inside the file",
      `timestamp,temperature_c\n${t1},21\ntimestamp,temperature_c\n${t2},22\n`,
      400,
      "csv_header_duplicate",
      3,
      undefined,
    ],
    ["an unknown column", `timestamp,temperature_c,humidity\n${t1},21,80\n`, 400, "csv_header_unknown", 1, 3],
    ["a non-numeric temperature", `timestamp,temperature_c\n${t1},21\n${t2},warm\n`, 400, "csv_value", 3, 2],
    ["a decimal comma", `timestamp,temperature_c\n${t1},"21,5"\n`, 400, "csv_value", 2, 2],
    ["an empty temperature", `timestamp,temperature_c\n${t1},\n`, 400, "csv_value", 2, 2],
    ["a non-numeric pH", `timestamp,temperature_c,ph\n${t1},21,seven\n`, 400, "csv_value", 2, 3],
    ["a temperature above 90 °C", `timestamp,temperature_c\n${t1},90.5\n`, 400, "csv_range", 2, 2],
    ["a temperature below −40 °C", `timestamp,temperature_c\n${t1},-40.1\n`, 400, "csv_range", 2, 2],
    ["a pH above 14", `timestamp,temperature_c,ph\n${t1},21,14.2\n`, 400, "csv_range", 2, 3],
    ["a gas level above 100 %", `timestamp,temperature_c,gas_level_percent\n${t1},21,101\n`, 400, "csv_range", 2, 3],
    ["a timestamp in the future", `timestamp,temperature_c\n${t1},21\n${future},22\n`, 400, "csv_future", 3, 1],
    ["a timestamp without offset", `timestamp,temperature_c\n2026-05-03T08:30:00,21\n`, 400, "csv_timestamp", 2, 1],
    ["a date that does not exist", `timestamp,temperature_c\n2026-02-30T08:30:00Z,21\n`, 400, "csv_timestamp", 2, 1],
    ["a line with too few values", `timestamp,temperature_c,ph\n${t1},21\n`, 400, "csv_columns", 2, 2],
    ["an unclosed quote", `timestamp,temperature_c\n${t1},"21\n`, 400, "csv_malformed", 2, undefined],
    ["an empty file", "", 400, "csv_empty", 1, undefined],
    ["only blank lines", "\n\n  \n", 400, "csv_empty", 1, undefined],
    ["a header and no rows", "timestamp,temperature_c\n", 400, "csv_empty", 1, undefined],
    [
      "a binary file (PNG)",
      Buffer.from([0x89, 0x50, 0x4e, 0x47, 0x0d, 0x0a, 0x1a, 0x0a, 0x00, 0x00, 0x00, 0x0d]),
      415,
      "csv_binary",
      3,
      1,
    ],
    [
      "text in Latin-1, not UTF-8",
      Buffer.from(`timestamp,temperature_c\n${t1},21\xb0\n`, "latin1"),
      415,
      "csv_binary",
      2,
      24,
    ],
    ["UTF-16 text", Buffer.from("\ufefftimestamp,temperature_c\n", "utf16le"), 415, "csv_binary", 1, 1],
  ];

  it.each(bad)(
    "when the file has %s, then it is refused with a 4xx naming line and column, and nothing is written",
    async (_name, file, status, code, line, column) => {
      const { digester, steward } = await setUp();
      const res = await upload(steward, digester.id, file);
      expect(res.status).toBe(status);
      expect(res.body.error.code).toBe(code);
      expect(res.body.error.fields.line).toBe(String(line));
      expect(res.body.error.message).toMatch(new RegExp(`^Line ${line}`));
      if (column !== undefined) {
        expect(res.body.error.fields.column).toBe(String(column));
        expect(res.body.error.message).toContain(`column ${column}`);
      }
      expect(await uploadCount(digester.id)).toBe(0);
    },
  );

  it("when one line among 10,000 is bad, then nothing is imported and the answer names that line and column", async () => {
    const { digester, steward } = await setUp();
    const stamps = minuteStamps(10_000);
    const lines = stamps.map((t, i) => `${t},${(25 + (i % 100) / 10).toFixed(1)},7.0`);
    // Data row 6,543 is line 6,544 (the header is line 1).
    lines[6_542] = `${stamps[6_542]},25.0,7.O`;
    const res = await upload(steward, digester.id, `timestamp,temperature_c,ph\n${lines.join("\n")}\n`);
    expect(res.status).toBe(400);
    expect(res.body.error).toMatchObject({
      code: "csv_value",
      fields: { line: "6544", column: "3", columnName: "ph" },
    });
    expect(res.body.error.message).toBe('Line 6544, column 3 (ph): "7.O" is not a number.');
    expect(await uploadCount(digester.id)).toBe(0);
  });

  it("when the file has 50,000 rows, then all are imported; with 50,001 it is a 413 naming the first line over", async () => {
    const { digester, steward } = await setUp();
    const stamps = minuteStamps(50_001, 60);
    const body = (n: number) =>
      `timestamp,temperature_c\n${stamps
        .slice(0, n)
        .map((t) => `${t},30`)
        .join("\n")}\n`;
    const over = await upload(steward, digester.id, body(50_001));
    expect(over.status).toBe(413);
    expect(over.body.error).toMatchObject({ code: "too_many_rows", fields: { line: "50002" } });
    expect(await uploadCount(digester.id)).toBe(0);
    const ok = await upload(steward, digester.id, body(50_000));
    expect(ok.status).toBe(200);
    expect(ok.body).toMatchObject({ imported: 50_000, skippedDuplicates: 0 });
    expect(await uploadCount(digester.id)).toBe(50_000);
  });

  it("when the file is over 5 MB, then it is a 413 and nothing is written", async () => {
    const { digester, steward } = await setUp();
    const row = `${minuteStamps(1)[0]},30\n`;
    const big = "timestamp,temperature_c\n" + row.repeat(Math.ceil((5 * 1024 * 1024) / row.length) + 10);
    const res = await upload(steward, digester.id, big);
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe("file_too_large");
    expect(await uploadCount(digester.id)).toBe(0);
  });

  it("when no file or the wrong form field is sent, then it is a 400 saying where the file goes", async () => {
    const { digester, steward } = await setUp();
    const none = await steward.post(`/api/digesters/${digester.id}/readings/import`).send({});
    expect(none.status).toBe(400);
    expect(none.body.error.fields).toHaveProperty("file");
    const wrongField = await upload(steward, digester.id, "timestamp,temperature_c\n", "csv");
    expect(wrongField.status).toBe(400);
    expect(wrongField.body.error.message).toContain('"file"');
  });

  it("when a coordinator, another digester's steward or a resident uploads, then it is 403 and nothing is written", async () => {
    const { digester } = await setUp();
    const { digester: other } = await warmDigester();
    const csv = `timestamp,temperature_c\n${minuteStamps(1)[0]},30\n`;
    const clients = [
      await signedInClient(app, { roles: ["coordinator"] }),
      await signedInClient(app, { roles: ["steward"], stewardOf: [other.id] }),
      await signedInClient(app, { roles: ["resident"] }),
    ];
    for (const client of clients) expect((await upload(client, digester.id, csv)).status).toBe(403);
    expect(await uploadCount(digester.id)).toBe(0);
  });

  it("when two digesters get a log with the same timestamps, then each keeps its own rows", async () => {
    const { digester, steward } = await setUp();
    const { digester: second } = await warmDigester({ temperatureC: null, ph: null });
    const both = await signedInClient(app, { roles: ["steward"], stewardOf: [digester.id, second.id] });
    const csv = `timestamp,temperature_c\n${minuteStamps(2)
      .map((t) => `${t},30`)
      .join("\n")}\n`;
    expect((await upload(steward, digester.id, csv)).body.imported).toBe(2);
    expect((await upload(both, second.id, csv)).body.imported).toBe(2);
  });
});
