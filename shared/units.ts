/**
 * Branded unit types and converters.
 *
 * A brand is a compile-time tag on a plain `number`: a `Pascal` is still a
 * number at run time (JSON, arithmetic, `toFixed` all work) and is assignable
 * to `number`, but a `Millibar` cannot be passed where a `Pascal` is expected.
 * Domain functions take plain numbers with the unit in the parameter name
 * (they arrive from JSON) and return branded values; converters take branded
 * values so a mix-up fails to compile. Brand a number with the helper of the
 * same name, e.g. `pascal(874)`.
 */

declare const unitBrand: unique symbol;

/** A number tagged with its unit `U` at compile time only. */
export type Quantity<U extends string> = number & { readonly [unitBrand]: U };

export type Kg = Quantity<"kg">;
/** Kilograms of volatile solids (the degradable organic part of the dry matter). */
export type KgVs = Quantity<"kgVs">;
export type Grams = Quantity<"g">;
export type Litres = Quantity<"L">;
export type CubicMetres = Quantity<"m3">;
export type DegreesC = Quantity<"degC">;
export type Pascal = Quantity<"Pa">;
export type Millibar = Quantity<"mbar">;
/** Millimetres of water column, the unit gas-holder pressure is usually quoted in. */
export type MmWaterColumn = Quantity<"mmWC">;
export type Metres = Quantity<"m">;
export type SquareMetres = Quantity<"m2">;
/** Percent, 0–100. */
export type Percent = Quantity<"%">;
/** A share or ratio, 0–1 (dimensionless). */
export type Fraction = Quantity<"fraction">;
export type Days = Quantity<"d">;
export type Hours = Quantity<"h">;
export type Minutes = Quantity<"min">;
export type MegaJoules = Quantity<"MJ">;
export type KgPerLitre = Quantity<"kg/L">;
export type LitresPerHour = Quantity<"L/h">;
export type GramsPerLitre = Quantity<"g/L">;
export type MgPerLitre = Quantity<"mg/L">;
export type KgVsPerDay = Quantity<"kgVs/d">;
export type KgVsPerM3Day = Quantity<"kgVs/m3/d">;
export type PerDay = Quantity<"1/d">;

/** Tag a plain number with a unit; no run-time cost. */
export const asUnit = <Q extends Quantity<string>>(value: number): Q => value as Q;

export const kg = (value: number): Kg => value as Kg;
export const kgVs = (value: number): KgVs => value as KgVs;
export const grams = (value: number): Grams => value as Grams;
export const litres = (value: number): Litres => value as Litres;
export const cubicMetres = (value: number): CubicMetres => value as CubicMetres;
export const degreesC = (value: number): DegreesC => value as DegreesC;
export const pascal = (value: number): Pascal => value as Pascal;
export const millibar = (value: number): Millibar => value as Millibar;
export const mmWaterColumn = (value: number): MmWaterColumn => value as MmWaterColumn;
export const metres = (value: number): Metres => value as Metres;
export const squareMetres = (value: number): SquareMetres => value as SquareMetres;
export const percent = (value: number): Percent => value as Percent;
export const fraction = (value: number): Fraction => value as Fraction;
export const days = (value: number): Days => value as Days;
export const hours = (value: number): Hours => value as Hours;
export const minutes = (value: number): Minutes => value as Minutes;
export const megaJoules = (value: number): MegaJoules => value as MegaJoules;
export const kgPerLitre = (value: number): KgPerLitre => value as KgPerLitre;
export const litresPerHour = (value: number): LitresPerHour => value as LitresPerHour;
export const gramsPerLitre = (value: number): GramsPerLitre => value as GramsPerLitre;
export const mgPerLitre = (value: number): MgPerLitre => value as MgPerLitre;
export const kgVsPerDay = (value: number): KgVsPerDay => value as KgVsPerDay;
export const kgVsPerM3Day = (value: number): KgVsPerM3Day => value as KgVsPerM3Day;
export const perDay = (value: number): PerDay => value as PerDay;

/** Standard gravity g = 9.80665 m/s² (exact by definition, CGPM 1901). */
export const STANDARD_GRAVITY_M_PER_S2 = 9.80665;

/** 1 mm of water column = ρ·g·h = 1000 kg/m³ × 9.80665 m/s² × 0.001 m = 9.80665 Pa (conventional, water at 4 °C). */
export const PASCAL_PER_MM_WATER_COLUMN = 9.80665;

/** 1 mbar = 100 Pa (exact). */
export const PASCAL_PER_MILLIBAR = 100;

/** Pa → mbar: mbar = Pa / 100. */
export const pascalToMillibar = (pressurePa: Pascal): Millibar => millibar(pressurePa / PASCAL_PER_MILLIBAR);
/** mbar → Pa: Pa = mbar × 100. */
export const millibarToPascal = (pressureMbar: Millibar): Pascal => pascal(pressureMbar * PASCAL_PER_MILLIBAR);
/** Pa → mm WC: mm = Pa / 9.80665. */
export const pascalToMmWaterColumn = (pressurePa: Pascal): MmWaterColumn =>
  mmWaterColumn(pressurePa / PASCAL_PER_MM_WATER_COLUMN);
/** mm WC → Pa: Pa = mm × 9.80665. */
export const mmWaterColumnToPascal = (pressureMmWc: MmWaterColumn): Pascal =>
  pascal(pressureMmWc * PASCAL_PER_MM_WATER_COLUMN);
/** mbar → mm WC: mm = mbar × 100 / 9.80665 ≈ mbar × 10.197. */
export const millibarToMmWaterColumn = (pressureMbar: Millibar): MmWaterColumn =>
  pascalToMmWaterColumn(millibarToPascal(pressureMbar));
/** mm WC → mbar: mbar = mm × 9.80665 / 100. */
export const mmWaterColumnToMillibar = (pressureMmWc: MmWaterColumn): Millibar =>
  pascalToMillibar(mmWaterColumnToPascal(pressureMmWc));

/** L → m³: m³ = L / 1000. */
export const litresToCubicMetres = (volumeL: Litres): CubicMetres => cubicMetres(volumeL / 1000);
/** m³ → L: L = m³ × 1000. */
export const cubicMetresToLitres = (volumeM3: CubicMetres): Litres => litres(volumeM3 * 1000);

/** kg → g. */
export const kgToGrams = (massKg: Kg): Grams => grams(massKg * 1000);
/** g → kg. */
export const gramsToKg = (massG: Grams): Kg => kg(massG / 1000);

/** % → fraction: f = % / 100. */
export const percentToFraction = (valuePercent: Percent): Fraction => fraction(valuePercent / 100);
/** fraction → %: % = f × 100. */
export const fractionToPercent = (valueFraction: Fraction): Percent => percent(valueFraction * 100);

/** h → min. */
export const hoursToMinutes = (durationH: Hours): Minutes => minutes(durationH * 60);
/** min → h. */
export const minutesToHours = (durationMin: Minutes): Hours => hours(durationMin / 60);
/** d → h. */
export const daysToHours = (durationD: Days): Hours => hours(durationD * 24);
/** h → d. */
export const hoursToDays = (durationH: Hours): Days => days(durationH / 24);

/** mg/L → g/L. */
export const mgPerLitreToGramsPerLitre = (concentrationMgPerL: MgPerLitre): GramsPerLitre =>
  gramsPerLitre(concentrationMgPerL / 1000);
/** g/L → mg/L. */
export const gramsPerLitreToMgPerLitre = (concentrationGPerL: GramsPerLitre): MgPerLitre =>
  mgPerLitre(concentrationGPerL * 1000);

/** Area of a circle of diameter D: A = π·D²/4 (m² from m). */
export const circleAreaM2 = (diameterM: number): SquareMetres => squareMetres((Math.PI * diameterM * diameterM) / 4);
