import { describe, expect, it } from "vitest";
import { safeNext } from "@/features/auth/utils/safe-next";

const origin = "http://127.0.0.1:3000";

describe("safeNext()", () => {
  it.each([
    ["/people", "/people"],
    ["/drop-offs?from=2026-05-01#today", "/drop-offs?from=2026-05-01#today"],
    ["/a/../account", "/account"],
  ])("when next is the relative path %s, then it is kept as %s", (next, expected) => {
    expect(safeNext(next, origin)).toBe(expected);
  });

  it.each([
    "https://elsewhere.example/phish",
    "//elsewhere.example/phish",
    "/\\elsewhere.example",
    "\\\\elsewhere.example",
    "javascript:alert(1)",
    "people",
    "",
    null,
    undefined,
  ])("when next is %s, then it is ignored", (next) => {
    expect(safeNext(next, origin)).toBeNull();
  });
});
