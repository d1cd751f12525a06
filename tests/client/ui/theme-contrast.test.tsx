import { describe, expect, it } from "vitest";
import { readFileSync } from "node:fs";
import { resolve } from "node:path";

// Relative luminance and contrast ratio exactly as defined in WCAG 2.2,
// "relative luminance" and "contrast ratio" [read: W3C WCAG 2.2 Recommendation, definitions].
function relativeLuminance(hex: string): number {
  const digits = hex.replace("#", "");
  const channel = (offset: number) => {
    const value = parseInt(digits.slice(offset, offset + 2), 16) / 255;
    return value <= 0.04045 ? value / 12.92 : ((value + 0.055) / 1.055) ** 2.4;
  };
  return 0.2126 * channel(0) + 0.7152 * channel(2) + 0.0722 * channel(4);
}

function contrastRatio(a: string, b: string): number {
  const [lighter, darker] = [relativeLuminance(a), relativeLuminance(b)].sort((x, y) => y - x) as [number, number];
  return (lighter + 0.05) / (darker + 0.05);
}

// Read from disk: Vitest stubs CSS imports (even ?raw) to "", and happy-dom's URL cannot build file paths.
const css = readFileSync(resolve(import.meta.dirname, "../../../src/index.css"), "utf8");

function tokens(block: string): Record<string, string> {
  const found: Record<string, string> = {};
  for (const match of block.matchAll(/--hl-([a-z-]+):\s*(#[0-9a-f]{6})\s*;/gi)) {
    found[match[1]!] = match[2]!;
  }
  return found;
}

const darkStart = css.indexOf("@media (prefers-color-scheme: dark)");
const themes = {
  light: tokens(css.slice(0, darkStart)),
  dark: tokens(css.slice(darkStart, css.indexOf("@layer base"))),
};

const roles = ["primary", "secondary", "accent", "danger", "warning", "success", "info"] as const;

// Targets from QUALITY.md: 7:1 for body text (WCAG 1.4.6), 4.5:1 for other text (1.4.3), 3:1 for UI boundaries (1.4.11).
const BODY = 7;
const TEXT = 4.5;
const UI = 3;

function pairs(): [string, string, number][] {
  const list: [string, string, number][] = [];
  for (const surface of ["background", "surface", "surface-muted"]) {
    list.push(["foreground", surface, BODY], ["muted", surface, BODY], ["border", surface, UI], ["ring", surface, UI]);
  }
  for (const role of roles) {
    list.push(
      [`${role}-foreground`, role, TEXT],
      [role, "background", TEXT],
      [role, "surface", TEXT],
      ["foreground", `${role}-subtle`, BODY],
      ["muted", `${role}-subtle`, BODY],
      [role, `${role}-subtle`, TEXT],
      ["border", `${role}-subtle`, UI],
    );
  }
  return list;
}

describe("contrast function", () => {
  it("when given black and white, then it gives the WCAG maximum of 21:1 and is symmetric", () => {
    // 21:1 is the top of the WCAG scale: (1 + 0.05) / (0 + 0.05) [read: WCAG 2.2, "contrast ratio" note].
    expect(contrastRatio("#000000", "#ffffff")).toBeCloseTo(21, 10);
    expect(contrastRatio("#ffffff", "#000000")).toBeCloseTo(21, 10);
    expect(contrastRatio("#777777", "#777777")).toBe(1);
  });

  it("when given #767676 on white, then it just passes 4.5:1 as commonly cited", () => {
    // #767676 on #ffffff ≈ 4.54:1, the usual "lightest grey that passes AA" [memory: WebAIM contrast checker].
    expect(contrastRatio("#767676", "#ffffff")).toBeCloseTo(4.54, 2);
  });
});

describe.each(Object.entries(themes))("%s theme tokens", (_name, theme) => {
  it("when parsed from index.css, then every role has its three tokens", () => {
    for (const role of roles) {
      expect(theme[role], role).toBeDefined();
      expect(theme[`${role}-foreground`], `${role}-foreground`).toBeDefined();
      expect(theme[`${role}-subtle`], `${role}-subtle`).toBeDefined();
    }
  });

  it.each(pairs())("when %s sits on %s, then contrast is at least %s:1", (text, surface, minimum) => {
    const foreground = theme[text];
    const background = theme[surface];
    expect(foreground, text).toBeDefined();
    expect(background, surface).toBeDefined();
    expect(contrastRatio(foreground!, background!)).toBeGreaterThanOrEqual(minimum);
  });
});
