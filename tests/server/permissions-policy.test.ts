/**
 * Every response carries a Permissions-Policy that denies the browser features Hearthloop does
 * not use (issue 10, point 10), on API answers, error answers and the client's pages alike.
 * Geolocation is denied too while the client never asks for it (it places homes by map click,
 * street list or typed coordinates); the last test fails when someone starts using it, as a
 * reminder to allow it for the app's own origin.
 */
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import request from "supertest";
import { mkdtempSync, readdirSync, readFileSync, rmSync, statSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import path from "node:path";
import { createApp } from "../../server/app";

/** `camera=(), geolocation=(self)` → { camera: "()", geolocation: "(self)" }. */
function directives(header: string | undefined): Record<string, string> {
  expect(header, "Permissions-Policy header").toBeTruthy();
  return Object.fromEntries(
    header!.split(",").map((part) => {
      const [feature, allow] = part.trim().split("=");
      return [feature!, allow!];
    }),
  );
}

/** Features a neighbourhood board has no use for; each must be denied outright. */
const mustDeny = [
  "camera",
  "microphone",
  "payment",
  "usb",
  "serial",
  "hid",
  "bluetooth",
  "midi",
  "display-capture",
  "accelerometer",
  "gyroscope",
  "magnetometer",
  "browsing-topics",
];

let dist: string;
beforeAll(() => {
  dist = mkdtempSync(path.join(tmpdir(), "hearthloop-dist-"));
  writeFileSync(path.join(dist, "index.html"), "<!doctype html><title>Hearthloop</title>");
});
afterAll(() => rmSync(dist, { recursive: true, force: true }));

describe("Permissions-Policy", () => {
  it("when the API answers, fails or serves the client, then each response denies the unused features", async () => {
    const app = createApp({ requestLogging: false, clientDist: dist });
    const answers: [string, request.Response][] = [
      ["API answer", await request(app).get("/api/health")],
      ["404", await request(app).get("/api/no-such-thing")],
      ["400", await request(app).post("/api/calc/titration").set("Content-Type", "application/json").send("{")],
      ["client page", await request(app).get("/map")],
    ];
    for (const [what, res] of answers) {
      const policy = directives(res.headers["permissions-policy"]);
      for (const feature of mustDeny) expect(policy[feature], `${what}: ${feature}`).toBe("()");
    }
  });

  it("when the client code asks for the position, then geolocation is allowed for the app itself only, else denied", async () => {
    const files: string[] = [];
    const walk = (dir: string) => {
      for (const name of readdirSync(dir)) {
        const full = path.join(dir, name);
        if (statSync(full).isDirectory()) walk(full);
        else if (/\.(ts|tsx)$/.test(name)) files.push(full);
      }
    };
    walk(path.resolve("src"));
    const usesGeolocation = files.some((f) => readFileSync(f, "utf8").includes("navigator.geolocation"));
    const res = await request(createApp({ requestLogging: false })).get("/api/health");
    expect(directives(res.headers["permissions-policy"]).geolocation).toBe(usesGeolocation ? "(self)" : "()");
  });
});
