/**
 * The model writer: the assignment GAP (see index.ts) as CPLEX LP text for HiGHS, MIP or
 * LP relaxation, over all options or a subset.
 */
import type { AssignmentModel, OptionSubset } from "./model";

const fmt = (n: number): string => {
  if (!Number.isFinite(n)) throw new Error(`non-finite coefficient ${n}`);
  if (Math.abs(n) < 1e-9) return "0";
  // toString can give "1e-7"; the LP reader accepts that, but fixed notation is easier to read.
  return Math.abs(n) < 1e-4 ? n.toFixed(12) : String(n);
};

/** Column name of item `item` at digester index `digester` in the LP text. */
export const xName = (item: number, digester: number) => `x${item}_${digester}`;
/** Column name of item `item`'s "unplaced" variable in the LP text. */
export const uName = (item: number) => `u${item}`;

/**
 * The assignment model (index.ts) as CPLEX LP text for HiGHS. `integer` adds the Binary
 * section (MIP); without it the text is the LP relaxation (x ≤ 1 is implied
 * by the assignment rows). `subset` restricts each item to some of its
 * options (positions into `items[i].digesters`); default all.
 * `withUnplaced[i] === false` drops item i's u column (only safe when the
 * remaining options are known to admit a feasible plan).
 * Names: x{item}_{digester}, u{item}; rows a{item}, c{digester}.
 */
export function buildAssignmentLp(
  model: AssignmentModel,
  integer: boolean,
  subset?: OptionSubset,
  withUnplaced?: readonly boolean[],
): string {
  const obj: string[] = [];
  const rows: string[] = [];
  const capTerms = new Map<number, string[]>();
  const binaries: string[] = [];
  model.items.forEach((item, i) => {
    const positions = subset?.[i] ?? [...item.digesters.keys()];
    const names: string[] = [];
    for (const p of positions) {
      const d = item.digesters[p]!;
      const name = xName(i, d);
      obj.push(`${fmt(item.costsDm[p]!)} ${name}`);
      names.push(name);
      if (item.kg > 0) {
        let t = capTerms.get(d);
        if (!t) capTerms.set(d, (t = []));
        t.push(`${fmt(item.kg)} ${name}`);
      }
      if (integer) binaries.push(name);
    }
    if (withUnplaced?.[i] ?? true) {
      obj.push(`${fmt(item.penaltyDm)} ${uName(i)}`);
      names.push(uName(i));
      if (integer) binaries.push(uName(i));
    }
    rows.push(` a${i}: ${names.join(" + ")} = 1`);
  });
  const chunk = (terms: string[]) => {
    const lines: string[] = [];
    for (let k = 0; k < terms.length; k += 50) lines.push(terms.slice(k, k + 50).join(" + "));
    return lines.join("\n   + ");
  };
  const caps = [...capTerms.entries()]
    .sort((a, b) => a[0] - b[0])
    .map(([d, terms]) => ` c${d}: ${chunk(terms)} <= ${fmt(Math.max(0, model.roomKg[d] ?? 0))}`);
  const parts = ["Minimize", ` obj: ${chunk(obj)}`, "Subject To", ...rows, ...caps];
  if (integer && binaries.length > 0) {
    parts.push("Binary");
    for (let k = 0; k < binaries.length; k += 50) parts.push(` ${binaries.slice(k, k + 50).join(" ")}`);
  }
  parts.push("End", "");
  return parts.join("\n");
}
