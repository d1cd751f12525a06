import { describe, expect, it } from "vitest";
import request from "supertest";
import { createApp } from "../../server/app";

describe("GET /api/health", () => {
  it("when the database answers, then it is 200 and reports database and mail", async () => {
    const res = await request(createApp({ requestLogging: false })).get("/api/health");
    expect(res.status).toBe(200);
    expect(res.body.database).toBe("up");
    expect(["up", "down"]).toContain(res.body.mail);
    expect(res.headers["cache-control"]).toBe("no-store");
    expect(res.headers["x-powered-by"]).toBeUndefined();
  });
});

describe("the API's error shape", () => {
  it("when the path is unknown, then it answers a JSON 404 in the error shape", async () => {
    const res = await request(createApp({ requestLogging: false })).get("/api/no-such-thing");
    expect(res.status).toBe(404);
    expect(res.body).toEqual({ error: { code: "not_found", message: expect.stringContaining("/no-such-thing") } });
  });

  it("when the JSON is malformed, then it answers 400 in the error shape", async () => {
    const res = await request(createApp({ requestLogging: false }))
      .post("/api/health")
      .set("Content-Type", "application/json")
      .send("{not json");
    expect(res.status).toBe(400);
    expect(res.body.error.code).toBe("malformed_json");
  });

  it("when the body is over the limit, then it answers 413", async () => {
    const res = await request(createApp({ requestLogging: false }))
      .post("/api/health")
      .set("Content-Type", "application/json")
      .send(JSON.stringify({ filler: "x".repeat(200_000) }));
    expect(res.status).toBe(413);
    expect(res.body.error.code).toBe("payload_too_large");
  });

  it("sets a content security policy without object embeds or base URLs", async () => {
    const res = await request(createApp({ requestLogging: false })).get("/api/health");
    const csp = String(res.headers["content-security-policy"]);
    expect(csp).toContain("object-src 'none'");
    expect(csp).toContain("base-uri 'none'");
  });
});
