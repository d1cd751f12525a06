/**
 * Scrap accounting: buckets → fresh kg → total solids (TS) → volatile solids
 * (VS), the mix's C:N and nitrogen, and flags for items to limit or refuse.
 * Figures and sources: DOMAIN.md §1.
 */
import {
  type Fraction,
  type Kg,
  type KgPerLitre,
  type KgVs,
  type Percent,
  fraction,
  kg,
  kgPerLitre,
  kgVs,
  percent,
} from "../units";

/** Ids of the scrap categories a drop-off may be split into. */
export const SCRAP_CATEGORIES = [
  "mixed",
  "fruitVeg",
  "cooked",
  "breadGrains",
  "coffee",
  "citrus",
  "eggshells",
] as const;

/** One scrap category id. `mixed` is the default mix used when a drop-off gives no categories. */
export type ScrapCategory = (typeof SCRAP_CATEGORIES)[number];

/** Composition and handling notes of one scrap category. Ranges are [low, high]; null where no figure is known. */
export interface ScrapCategoryProfile {
  readonly id: ScrapCategory;
  readonly label: string;
  /** Default total solids, % of fresh mass. */
  readonly tsPercent: number;
  readonly tsRangePercent: readonly [number, number] | null;
  /** Default volatile solids, % of TS. */
  readonly vsPercentOfTs: number;
  readonly vsRangePercentOfTs: readonly [number, number] | null;
  /** Default C:N by mass; null where no figure is known (eggshells). */
  readonly cToN: number | null;
  readonly cToNRange: readonly [number, number] | null;
  /** Nitrogen, % of TS; read for the default mix, derived from C:N for the others (see {@link carbonPercentOfTs}). */
  readonly nPercentOfTs: number | null;
  readonly note: string;
  readonly source: string;
}

/**
 * Organic carbon as % of TS from VS: C ≈ VS / 1.8.
 * Units: % of TS in, % of TS out. Source: the usual compost-engineering
 * conversion (organic matter ≈ 1.8 × organic carbon) [memory: Haug 1993,
 * *The Practical Handbook of Compost Engineering*]; used only to turn a C:N
 * into a nitrogen share where no nitrogen figure is published.
 */
export const carbonPercentOfTs = (vsPercentOfTs: number): Percent => percent(vsPercentOfTs / 1.8);

const nFromCToN = (vsPercentOfTs: number, cToN: number): number => carbonPercentOfTs(vsPercentOfTs) / cToN;

/** Default mix ("mixed household scraps"): TS 26 %, VS 87 % of TS, N 3.2 % of TS [read TS/VS, memory N: Zhang et al. 2007]. */
const MIXED_TS_PERCENT = 26;
const MIXED_VS_PERCENT_OF_TS = 87;
const MIXED_N_PERCENT_OF_TS = 3.2;

/**
 * Defaults per category (DOMAIN.md §1). Where DOMAIN.md gives a range only,
 * the default inside it is our judgement; nitrogen for all but the default mix
 * is derived from the C:N and {@link carbonPercentOfTs}.
 */
export const SCRAP_CATEGORY_PROFILES: Readonly<Record<ScrapCategory, ScrapCategoryProfile>> = {
  mixed: {
    id: "mixed",
    label: "Mixed household scraps",
    tsPercent: MIXED_TS_PERCENT,
    tsRangePercent: [26, 30],
    vsPercentOfTs: MIXED_VS_PERCENT_OF_TS,
    vsRangePercentOfTs: [83, 87],
    // Derived: (87 / 1.8) / 3.2 ≈ 15.1, close to the C:N Zhang et al. report for the same waste.
    cToN: carbonPercentOfTs(MIXED_VS_PERCENT_OF_TS) / MIXED_N_PERCENT_OF_TS,
    cToNRange: null,
    nPercentOfTs: MIXED_N_PERCENT_OF_TS,
    note: "Used when a drop-off gives no categories.",
    source: "Zhang et al. 2007, Bioresour. Technol. 98:929 [read TS/VS; memory N]",
  },
  fruitVeg: {
    id: "fruitVeg",
    label: "Fruit and vegetables",
    tsPercent: 14,
    tsRangePercent: [8, 18],
    vsPercentOfTs: 89,
    vsRangePercentOfTs: [86, 92],
    cToN: 25,
    cToNRange: [20, 35],
    nPercentOfTs: nFromCToN(89, 25),
    note: "Base feed; acidifies fast in large doses.",
    source: "Bouallagui et al. 2005, Process Biochem. 40:989 [memory]; C:N default [judgement]",
  },
  cooked: {
    id: "cooked",
    label: "Cooked food and leftovers",
    tsPercent: 27,
    tsRangePercent: [20, 30],
    vsPercentOfTs: 90,
    vsRangePercentOfTs: [85, 95],
    cToN: 16,
    cToNRange: [13, 20],
    nPercentOfTs: nFromCToN(90, 16),
    note: "High gas yield and high nitrogen.",
    source: "Zhang et al. 2007 [read]; C:N default [judgement]",
  },
  breadGrains: {
    id: "breadGrains",
    label: "Bread, rice and pasta",
    tsPercent: 55,
    tsRangePercent: [35, 65],
    vsPercentOfTs: 96,
    vsRangePercentOfTs: [95, 98],
    cToN: 25,
    cToNRange: [20, 30],
    nPercentOfTs: nFromCToN(96, 25),
    note: "Turns to acid very fast: keep its share small.",
    source: "[memory]; defaults [judgement]",
  },
  coffee: {
    id: "coffee",
    label: "Coffee grounds",
    tsPercent: 40,
    tsRangePercent: [35, 45],
    vsPercentOfTs: 98,
    vsRangePercentOfTs: [97, 99],
    cToN: 20,
    cToNRange: null,
    nPercentOfTs: nFromCToN(98, 20),
    note: "Slow to break down.",
    source: "[memory]",
  },
  citrus: {
    id: "citrus",
    label: "Citrus peel",
    tsPercent: 18,
    tsRangePercent: [15, 20],
    vsPercentOfTs: 95,
    vsRangePercentOfTs: null,
    cToN: 40,
    cToNRange: [35, 50],
    nPercentOfTs: nFromCToN(95, 40),
    note: "Peel oil (limonene) slows the gas-making microbes: at most a tenth of a day's scraps.",
    source: "Ruiz & Flotats 2014, Waste Manag. 34:2063 [read range]; 10 % share [judgement]",
  },
  eggshells: {
    id: "eggshells",
    label: "Eggshells",
    tsPercent: 95,
    tsRangePercent: null,
    vsPercentOfTs: 4,
    vsRangePercentOfTs: [0, 5],
    cToN: null,
    cToNRange: null,
    nPercentOfTs: null,
    note: "Inert grit that settles in the tank: crush finely and keep to small amounts.",
    source: "[memory]",
  },
};

/** The default mix's kg VS per fresh kg: 0.26 × 0.87 = 0.2262 (DOMAIN.md §1, Zhang et al. 2007 [read]). */
export const DEFAULT_KG_VS_PER_FRESH_KG = (MIXED_TS_PERCENT / 100) * (MIXED_VS_PERCENT_OF_TS / 100);

/** Default TS of scraps when none is given, % of fresh mass (the default mix). */
export const DEFAULT_SCRAPS_TS_PERCENT = MIXED_TS_PERCENT;
/** Default VS of scraps when none is given, % of TS (the default mix). */
export const DEFAULT_SCRAPS_VS_PERCENT_OF_TS = MIXED_VS_PERCENT_OF_TS;

/**
 * Bulk density of loosely filled wet scraps, kg per litre of bucket volume:
 * 0.5 [judgement]; published factors range 0.235–0.90 kg/L (US EPA 2016,
 * *Volume-to-Weight Conversion Factors* [2ary]).
 */
export const DEFAULT_BUCKET_KG_PER_LITRE = 0.5;

/** Citrus above this share of a day's fresh mass is flagged (DOMAIN.md §1 [judgement]). */
export const CITRUS_MAX_SHARE = 0.1;
/** Bread/rice/pasta above this share of fresh mass is flagged [judgement: DOMAIN.md §1 says "limit share" without a figure]. */
export const BREAD_MAX_SHARE = 0.2;
/** Eggshells above this share of fresh mass are flagged [judgement: "refuse or limit", DOMAIN.md §1]. */
export const EGGSHELLS_MAX_SHARE = 0.05;

/**
 * kg VS in a fresh mass: kg VS = fresh kg × TS/100 × VS/100.
 * Units: kg fresh, % of fresh mass, % of TS → kg VS. Source: DOMAIN.md §1.
 */
export function kgVsFromFreshKg(
  freshKg: number,
  tsPercent: number = DEFAULT_SCRAPS_TS_PERCENT,
  vsPercentOfTs: number = DEFAULT_SCRAPS_VS_PERCENT_OF_TS,
): KgVs {
  return kgVs(freshKg * (tsPercent / 100) * (vsPercentOfTs / 100));
}

/**
 * Fresh kg holding a given kg VS (inverse of {@link kgVsFromFreshKg}):
 * fresh kg = kg VS / (TS/100 × VS/100). Units: kg VS → kg fresh.
 */
export function freshKgFromKgVs(
  feedKgVs: number,
  tsPercent: number = DEFAULT_SCRAPS_TS_PERCENT,
  vsPercentOfTs: number = DEFAULT_SCRAPS_VS_PERCENT_OF_TS,
): Kg {
  return kg(feedKgVs / ((tsPercent / 100) * (vsPercentOfTs / 100)));
}

/** How a drop-off's mass was obtained. Weighed buckets win over estimates. */
export type MassMethod = "weighed" | "estimated";

/** Result of {@link estimateFreshKg}. */
export interface FreshMassEstimate {
  readonly freshKg: Kg;
  readonly method: MassMethod;
  /** The bulk density used; null when the bucket was weighed. */
  readonly kgPerLitre: KgPerLitre | null;
}

/**
 * Fresh mass of a drop-off: the weighed mass when given, else
 * bucket litres × bulk density (default 0.5 kg/L [judgement]; published
 * 0.235–0.90 kg/L, US EPA 2016 [2ary]). Says which method was used so the
 * record can show "weighed" or "estimated" (DOMAIN.md §1).
 */
export function estimateFreshKg(input: {
  readonly bucketLitres: number;
  readonly kgPerLitre?: number | null;
  readonly weighedKg?: number | null;
}): FreshMassEstimate {
  if (input.weighedKg !== undefined && input.weighedKg !== null) {
    return { freshKg: kg(input.weighedKg), method: "weighed", kgPerLitre: null };
  }
  const density = input.kgPerLitre ?? DEFAULT_BUCKET_KG_PER_LITRE;
  return { freshKg: kg(input.bucketLitres * density), method: "estimated", kgPerLitre: kgPerLitre(density) };
}

/**
 * A scrap mix: non-negative weights per category, as fresh-mass shares or as
 * kg (only the proportions matter). Missing categories count as 0. An empty or
 * all-zero mix means the default mix.
 */
export type ScrapMix = Partial<Record<ScrapCategory, number>>;

/** Composition of a mix, from {@link describeMix}. */
export interface MixComposition {
  /** Shares of fresh mass per category, summing to 1. */
  readonly shares: Readonly<Record<ScrapCategory, Fraction>>;
  readonly tsPercent: Percent;
  readonly vsPercentOfTs: Percent;
  readonly kgVsPerFreshKg: number;
  /** N of the mix, % of TS; categories without a nitrogen figure count as 0 N. */
  readonly nPercentOfTs: Percent;
  /** C:N of the mix by mass; null when the mix holds no nitrogen. */
  readonly cToN: number | null;
}

/**
 * Normalise a mix to fresh-mass shares summing to 1. Negative or non-finite
 * weights count as 0; an all-zero mix becomes the default mix (`mixed` = 1).
 */
export function normaliseMix(mix: ScrapMix): Record<ScrapCategory, Fraction> {
  let total = 0;
  for (const id of SCRAP_CATEGORIES) total += cleanWeight(mix[id]);
  const shares = {} as Record<ScrapCategory, Fraction>;
  for (const id of SCRAP_CATEGORIES) {
    shares[id] = fraction(total > 0 ? cleanWeight(mix[id]) / total : id === "mixed" ? 1 : 0);
  }
  return shares;
}

function cleanWeight(weight: number | undefined): number {
  return weight !== undefined && Number.isFinite(weight) && weight > 0 ? weight : 0;
}

/**
 * TS, VS, N and C:N of a mix by mass balance over the categories' defaults:
 * TS = Σ sᵢ·TSᵢ; VS/TS = Σ sᵢ·TSᵢ·VSᵢ / TS; N/TS = Σ sᵢ·TSᵢ·Nᵢ / TS;
 * C = Σ sᵢ·TSᵢ·VSᵢ/1.8; C:N = C / N (sᵢ fresh-mass shares).
 * Units: % of fresh mass, % of TS, kg VS per fresh kg. Source: DOMAIN.md §1
 * defaults; carbon from VS per {@link carbonPercentOfTs} [memory].
 */
export function describeMix(mix: ScrapMix): MixComposition {
  const shares = normaliseMix(mix);
  let ts = 0;
  let vs = 0;
  let n = 0;
  let c = 0;
  for (const id of SCRAP_CATEGORIES) {
    const share = shares[id];
    if (share === 0) continue;
    const profile = SCRAP_CATEGORY_PROFILES[id];
    const tsShare = share * (profile.tsPercent / 100);
    ts += tsShare;
    vs += tsShare * (profile.vsPercentOfTs / 100);
    n += tsShare * ((profile.nPercentOfTs ?? 0) / 100);
    // The default mix's C:N is itself derived from VS/1.8, so carbon is computed one way for all.
    c += (tsShare * carbonPercentOfTs(profile.vsPercentOfTs)) / 100;
  }
  return {
    shares,
    tsPercent: percent(ts * 100),
    vsPercentOfTs: percent(ts > 0 ? (vs / ts) * 100 : 0),
    kgVsPerFreshKg: vs,
    nPercentOfTs: percent(ts > 0 ? (n / ts) * 100 : 0),
    cToN: n > 0 ? c / n : null,
  };
}

/**
 * kg VS in a fresh mass of a given mix: kg VS = fresh kg × Σ sᵢ·TSᵢ·VSᵢ.
 * Units: kg fresh → kg VS. Source: DOMAIN.md §1.
 */
export function kgVsFromMix(freshKg: number, mix: ScrapMix = {}): KgVs {
  return kgVs(freshKg * describeMix(mix).kgVsPerFreshKg);
}

/**
 * Nitrogen in a fresh mass of a given mix: kg N = fresh kg × TS × N/TS.
 * Units: kg fresh → kg N. Source: DOMAIN.md §1 (N of the default mix [memory]).
 */
export function nitrogenKgFromMix(freshKg: number, mix: ScrapMix = {}): Kg {
  const composition = describeMix(mix);
  return kg(freshKg * (composition.tsPercent / 100) * (composition.nPercentOfTs / 100));
}

/** Ids of items a digester refuses. */
export const REFUSE_ITEMS = [
  "meat",
  "fish",
  "bones",
  "dairy",
  "oilsFats",
  "plastics",
  "glass",
  "metal",
  "detergents",
  "disinfectants",
  "medicines",
] as const;

/** One refused item id. */
export type RefuseItem = (typeof REFUSE_ITEMS)[number];

/** A refused item with a plain label; `pasteurisationException` items are accepted only where the site pasteurises. */
export interface RefuseItemInfo {
  readonly id: RefuseItem;
  readonly label: string;
  readonly pasteurisationException: boolean;
}

/**
 * Pasteurisation that lifts the refusal of animal products: 70 °C for 60 min
 * at ≤ 12 mm particle size [read: Reg. (EU) 142/2011 Annex V Ch. I Sec. 1].
 */
export const PASTEURISATION_NOTE =
  "Meat, fish, bones and dairy are accepted only where the site pasteurises: 70 °C for 60 minutes with pieces no larger than 12 mm (Reg. (EU) 142/2011, Annex V). Local animal-by-product rules decide.";

/** The refuse list of DOMAIN.md §1 with plain labels. */
export const REFUSE_ITEM_INFO: Readonly<Record<RefuseItem, RefuseItemInfo>> = {
  meat: { id: "meat", label: "Meat", pasteurisationException: true },
  fish: { id: "fish", label: "Fish", pasteurisationException: true },
  bones: { id: "bones", label: "Bones", pasteurisationException: true },
  dairy: { id: "dairy", label: "Dairy (milk, cheese, yoghurt)", pasteurisationException: true },
  oilsFats: { id: "oilsFats", label: "Cooking oil and fat in quantity", pasteurisationException: false },
  plastics: {
    id: "plastics",
    label: "Plastics, including bags sold as compostable",
    pasteurisationException: false,
  },
  glass: { id: "glass", label: "Glass", pasteurisationException: false },
  metal: { id: "metal", label: "Metal (foil, tins, cutlery)", pasteurisationException: false },
  detergents: { id: "detergents", label: "Detergents and soap", pasteurisationException: false },
  disinfectants: { id: "disinfectants", label: "Disinfectants and bleach", pasteurisationException: false },
  medicines: { id: "medicines", label: "Medicines", pasteurisationException: false },
};

/** Codes of the flags raised by {@link assessScraps}. */
export type ScrapFlagCode = "citrusOverLimit" | "breadOverLimit" | "eggshellsOverLimit" | "refuseItem";

/** A flag on a drop-off or a day's scraps. `refuse` means turn the item away; `limit` means keep it small. */
export interface ScrapFlag {
  readonly code: ScrapFlagCode;
  readonly severity: "limit" | "refuse";
  readonly message: string;
  /** The refused item, for `refuseItem` flags. */
  readonly item?: RefuseItem;
}

/**
 * Flags for a mix and any refused items seen: citrus share > 10 % of the
 * fresh mass (limonene, Ruiz & Flotats 2014 [read range; judgement share]),
 * bread/rice/pasta share > 20 % [judgement], eggshells > 5 % [judgement],
 * and each refused item (meat, fish, bones and dairy are accepted when the
 * site pasteurises, Reg. (EU) 142/2011 [read]). Pass the day's total per
 * category to check "a day's fresh mass".
 */
export function assessScraps(input: {
  readonly mix: ScrapMix;
  readonly refuseItems?: readonly RefuseItem[];
  readonly sitePasteurises?: boolean;
}): ScrapFlag[] {
  const flags: ScrapFlag[] = [];
  const shares = normaliseMix(input.mix);
  if (shares.citrus > CITRUS_MAX_SHARE) {
    flags.push({
      code: "citrusOverLimit",
      severity: "limit",
      message: `Citrus peel is ${formatShare(shares.citrus)} of these scraps; keep it to a tenth at most, its oil slows the gas-making microbes.`,
    });
  }
  if (shares.breadGrains > BREAD_MAX_SHARE) {
    flags.push({
      code: "breadOverLimit",
      severity: "limit",
      message: `Bread, rice and pasta are ${formatShare(shares.breadGrains)} of these scraps; they turn to acid fast, so keep them to a fifth at most.`,
    });
  }
  if (shares.eggshells > EGGSHELLS_MAX_SHARE) {
    flags.push({
      code: "eggshellsOverLimit",
      severity: "limit",
      message: `Eggshells are ${formatShare(shares.eggshells)} of these scraps; they do not break down and settle as grit. Crush them and keep them few.`,
    });
  }
  const seen = new Set<RefuseItem>();
  for (const item of input.refuseItems ?? []) {
    if (seen.has(item)) continue;
    seen.add(item);
    const info = REFUSE_ITEM_INFO[item];
    if (info.pasteurisationException && input.sitePasteurises === true) continue;
    flags.push({
      code: "refuseItem",
      severity: "refuse",
      item,
      message: info.pasteurisationException
        ? `${info.label}: not accepted here. ${PASTEURISATION_NOTE}`
        : `${info.label}: never goes into the digester.`,
    });
  }
  return flags;
}

function formatShare(share: number): string {
  return `${Math.round(share * 100)} %`;
}
