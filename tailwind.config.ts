import type { Config } from "tailwindcss";

/**
 * Colours are named by ROLE, never by hue, so a feature says `bg-danger` or
 * `text-muted` and the palette can change in one place (src/index.css).
 * Values live in CSS variables (`--hl-*`) so the dark scheme swaps them
 * without touching class names. The `--hl-` prefix keeps them apart from the
 * `--color-*` variables Tailwind 4 generates from this file; reusing that
 * name would make each variable refer to itself.
 *
 * Each role R has three tokens:
 *   R             strong colour: text/icons on background or surface, or a fill
 *   R-foreground  text on an R fill
 *   R-subtle      soft background for notices, with `foreground` text on it
 *
 * Contrast ratios, WCAG 2.2 relative-luminance formula (SC 1.4.3 / 1.4.6 /
 * 1.4.11 definitions) [read], computed from the values in src/index.css and
 * re-checked by tests/client/ui/theme-contrast.test.tsx:
 *
 *   pair                          light   dark
 *   foreground on background      15.4    15.9
 *   foreground on surface         16.7    14.6
 *   foreground on surface-muted   14.1    12.8
 *   muted on background            8.0     9.9
 *   muted on surface-muted         7.3     8.0
 *   muted on any R-subtle        ≥ 7.1   ≥ 7.6
 *   foreground on any R-subtle   ≥ 13.8  ≥ 12.3
 *   primary-fg on primary          8.0     9.9
 *   primary on background          7.4    10.3
 *   secondary-fg on secondary      9.7    11.5
 *   accent-fg on accent            9.2     9.6
 *   danger-fg on danger            7.8     9.3
 *   danger on background           7.2     9.4
 *   warning-fg on warning          7.7    10.3
 *   warning on background          7.1    11.1
 *   success-fg on success          8.0    10.0
 *   info-fg on info                8.8     9.3
 *   R on its own R-subtle        ≥ 6.5   ≥ 7.9
 *   border on background           3.6     4.5
 *   border on any R-subtle       ≥ 3.2   ≥ 3.5
 *   ring on background             7.4    10.3
 *
 * Targets: ≥ 7:1 for body text (foreground, muted), ≥ 4.5:1 for every other
 * text pair, ≥ 3:1 for borders and focus rings (QUALITY.md, WCAG 2.2 AA/AAA).
 */
const role = (name: string) => ({
  DEFAULT: `var(--hl-${name})`,
  foreground: `var(--hl-${name}-foreground)`,
  subtle: `var(--hl-${name}-subtle)`,
});

export default {
  theme: {
    extend: {
      colors: {
        background: "var(--hl-background)",
        foreground: "var(--hl-foreground)",
        surface: { DEFAULT: "var(--hl-surface)", muted: "var(--hl-surface-muted)" },
        border: "var(--hl-border)",
        ring: "var(--hl-ring)",
        muted: "var(--hl-muted)",
        overlay: "var(--hl-overlay)",
        primary: role("primary"),
        secondary: role("secondary"),
        accent: role("accent"),
        danger: role("danger"),
        warning: role("warning"),
        success: role("success"),
        info: role("info"),
      },
      fontFamily: {
        sans: ['"Atkinson Hyperlegible"', "system-ui", "-apple-system", '"Segoe UI"', "Roboto", "sans-serif"],
      },
    },
  },
} satisfies Config;
