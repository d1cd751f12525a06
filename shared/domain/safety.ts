/**
 * The cautions shown beside gas, pressure, heating and digestate figures
 * (DOMAIN.md §6, §3 and §4). Plain sentences; screens show them as a list.
 */

/**
 * Gas cautions. Sources (DOMAIN.md §6): flammable range of methane about
 * 5–15 % in air [2ary]; hydrogen sulphide toxic, smell fades above ~100 ppm,
 * OSHA ceiling 20 ppm [read: OMAFRA factsheet "Hydrogen sulphide in
 * agricultural biogas systems", Table 1]; oxygen displacement in pits.
 */
export const GAS_CAUTIONS: readonly string[] = [
  "Biogas burns in air at about 5–15 %: no flames, smoking or sparks near the digester or the gas holder.",
  "Biogas contains hydrogen sulphide, which is toxic. Above about 100 ppm you can no longer smell it, so a fading smell is no sign of safety (the OSHA ceiling is 20 ppm).",
  "Biogas and carbon dioxide push the air out of pits and tanks: never enter a tank or pit alone, and never without airing it and someone watching from outside.",
  "Fit a flame trap in the gas line and drain condensate from the pipes regularly.",
];

/** Pressure cautions for floating gas holders (DOMAIN.md §3: air drawn in under a grounded drum forms an explosive mixture). */
export const PRESSURE_CAUTIONS: readonly string[] = [
  "Never let the drum bottom out while drawing gas: air is sucked in and forms an explosive mixture. Stop using gas while the drum still floats.",
  "Fix added weights evenly so they cannot slide or tip the drum, and stay within the gas holder supplier's limits for pressure and load.",
];

/**
 * Digestate cautions (DOMAIN.md §4): digestate from unheated digesters is not
 * sanitised [read: DOMAIN.md §4; pasteurisation per Reg. (EU) 142/2011].
 */
export const DIGESTATE_CAUTIONS: readonly string[] = [
  "Digestate from an unheated digester is not sanitised: put it on the soil, not on the leaves of crops eaten raw, and not in the weeks before harvest.",
  "Wash your hands after handling digestate, and keep children and pets away from it.",
  "Store it covered: it still gives off some gas and smells.",
];

/** The general statement under every estimate (DOMAIN.md §6). */
export const ESTIMATES_STATEMENT =
  "These figures are estimates. Local gas, building, waste and animal-by-product rules, the supplier's instructions and licensed practitioners decide.";
