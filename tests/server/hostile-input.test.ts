/**
 * Hostile keys and bodies (issue 10, point 1): prototype-changing keys at any depth of a JSON
 * body or in the query, bodies whose Content-Encoding lies, JSON bodies that are not objects,
 * and nesting deep enough to overflow a recursive walker. Each gets a 400/415 in the app's
 * error shape and changes nothing, on the public calculators as on signed-in routes.
 */
import { describe, expect, it } from "vitest";
import request from "supertest";
import zlib from "node:zlib";
import { z } from "zod";
import { createApp } from "../../server/app";
import { zodFields } from "../../server/lib/zod-fields";
import { signedInClient, sql } from "../helpers/db";

const app = createApp({ requestLogging: false });

/** A valid titration body (A 5 mL, B 2 mL): the public calculator answers 200 for it. */
const titration = '"aMl": 5, "bMl": 2';

/** POSTs raw bytes as JSON, so keys such as __proto__ reach the server exactly as written. */
function postJson(path: string, raw: string | Buffer, headers: Record<string, string> = {}) {
  const req = request(app).post(path).set("Content-Type", "application/json");
  for (const [k, v] of Object.entries(headers)) req.set(k, v);
  return req.send(raw);
}

describe("prototype keys in a JSON body", () => {
  it("when a valid calculator body also carries __proto__, then it is 400 naming the key, not a 500", async () => {
    const control = await postJson("/api/calc/titration", `{${titration}}`);
    expect(control.status).toBe(200);

    const res = await postJson("/api/calc/titration", `{${titration}, "__proto__": {"isAdmin": true}}`);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("invalid_input");
    expect(Object.keys(res.body.error.fields)).toEqual(["__proto__"]);
    expect(res.body.error.message).toContain("__proto__");
  });

  it.each([
    ["constructor", "constructor", `{${titration}, "constructor": {"prototype": {"x": 1}}}`],
    ["prototype", "prototype", `{${titration}, "prototype": 1}`],
    ["__proto__ deep in an array", "x.1.y.__proto__", `{${titration}, "x": [1, {"y": {"__proto__": 1}}]}`],
    ["__proto__ with a string value", "__proto__", `{"__proto__": "x", ${titration}}`],
  ])("when the body carries %s, then it is 400 naming %s", async (_label, field, raw) => {
    const res = await postJson("/api/calc/titration", raw);
    expect(res.status).toBe(400);
    expect(res.body.error.fields).toHaveProperty([field]);
  });

  it("when a signed-in person renames themselves with a __proto__ key beside the name, then it is 400 and the name stays", async () => {
    const resident = await signedInClient(app, { roles: ["resident"] });
    const res = await resident
      .patch("/api/account")
      .set("Content-Type", "application/json")
      .send('{"name": "Hostile Name", "__proto__": {"roles": ["coordinator"]}}');
    expect(res.status).toBe(400);
    expect(Object.keys(res.body.error.fields)).toEqual(["__proto__"]);
    const [row] = await sql<{ name: string; roles: string[] }>(`SELECT name, roles FROM people WHERE id = $1`, [
      resident.person.id,
    ]);
    expect(row).toEqual({ name: resident.person.name, roles: ["resident"] });
  });

  it("when a query key is __proto__ or constructor (also in brackets), then it is 400 naming it, even on routes without a query schema", async () => {
    for (const [query, field] of [
      ["__proto__=1", "query.__proto__"],
      ["a[constructor]=1", "query.a[constructor]"],
      ["prototype=1", "query.prototype"],
    ] as const) {
      const res = await request(app).get(`/api/public/digesters?${query}`);
      expect(res.status, query).toBe(400);
      expect(res.body.error.fields, query).toHaveProperty([field]);
    }
    expect((await request(app).get("/api/public/digesters?harmless=1")).status).toBe(200);
  });
});

describe("field maps from user keys", () => {
  it("when zod names an unknown __proto__ key, then the field map keeps it as a plain key (no prototype to change)", () => {
    const result = z.object({ a: z.number() }).strict().safeParse(JSON.parse('{"a": 1, "__proto__": {"x": 1}}'));
    expect(result.success).toBe(false);
    const fields = zodFields(result.error!);
    expect(Object.getPrototypeOf(fields)).toBeNull();
    expect(Object.keys(fields)).toEqual(["__proto__"]);
  });
});

describe("Content-Encoding that does not match the bytes", () => {
  it.each(["gzip", "deflate", "br"])(
    "when the body says %s but is plain JSON, then it is 400 in the error shape",
    async (encoding) => {
      const res = await postJson("/api/calc/titration", `{${titration}}`, { "Content-Encoding": encoding });
      expect(res.status).toBe(400);
      expect(res.body.error.code).toBe("invalid_content_encoding");
      expect(res.body.error.message).toContain(encoding);
    },
  );

  it("when the encoding is one the server does not read, then it is 415 in the error shape", async () => {
    const res = await postJson("/api/calc/titration", `{${titration}}`, { "Content-Encoding": "x-rot13" });
    expect(res.status).toBe(415);
    expect(res.body.error.code).toBe("unsupported_content_encoding");
  });

  it("when the body really is gzip-compressed JSON, then it is read as usual", async () => {
    const res = await request(app)
      .post("/api/calc/titration")
      .set("Content-Type", "application/json")
      .set("Content-Encoding", "gzip")
      // Bytes as they are: superagent would otherwise serialise a Buffer as JSON.
      .serialize((bytes: unknown) => bytes as string)
      .send(zlib.gzipSync(Buffer.from(`{${titration}}`)));
    expect(res.status).toBe(200);
  });
});

describe("JSON bodies that are not objects", () => {
  it.each([
    ["null", "null"],
    ["a number", "42"],
    ["a string", '"hello"'],
    ["an array", "[1, 2]"],
  ])("when the body is %s, then it is 400 'the body must be an object'", async (_label, raw) => {
    const res = await postJson("/api/calc/titration", raw);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("invalid_input");
    expect(res.body.error.message).toMatch(/the body must be an object/i);
    expect(res.body.error.fields).toEqual({ body: expect.any(String) });
  });

  it("when a signed-in person sends null to a route with defaults, then it is 400 and nothing is written", async () => {
    const resident = await signedInClient(app, { roles: ["resident"] });
    const res = await resident.post("/api/households").set("Content-Type", "application/json").send("null");
    expect(res.status).toBe(400);
    expect(
      await sql(`SELECT household_id FROM people WHERE id = $1 AND household_id IS NOT NULL`, [resident.person.id]),
    ).toHaveLength(0);
  });
});

describe("deep nesting", () => {
  it.each([
    ["arrays", `{"x": ${"[".repeat(2_000)}${"]".repeat(2_000)}}`],
    ["objects", `{"x": ${'{"a": '.repeat(2_000)}1${"}".repeat(2_000)}}`],
    ["arrays 50,000 deep", `{"x": ${"[".repeat(50_000)}${"]".repeat(50_000)}}`],
  ])("when the body nests %s, then it is 400 naming the field, never a stack overflow", async (_label, raw) => {
    const res = await postJson("/api/calc/titration", raw);
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("invalid_input");
    expect(res.body.error.fields).toEqual({ x: expect.stringMatching(/nested/) });
  });

  it("when the body nests as deep as real requests do, then it is read as usual", async () => {
    const res = await postJson(
      "/api/calc/feed-budget",
      '{"workingVolumeM3": 1, "temperatureC": 35, "fedKgVsPrevious7Days": [0.5, 0.5]}',
    );
    expect(res.status).toBe(200);
  });
});
