/**
 * The digester page: profile, status, today's detail and the daily history for its charts.
 * Stewards of the digester and coordinators only (checked here as well as on the route).
 */
import { expectedDailyGas, OLR_REF_CAP_KG_VS_PER_M3_DAY, temperatureFactor } from "../../../shared/domain";
import type {
  DigesterHistory,
  DigesterHistoryDay,
  DigesterProfile,
  UpdateDigesterProfileParsed,
} from "../../../shared/schemas/digester";
import { env } from "../../config/env";
import { sequelize } from "../../db/sequelize";
import { badRequest, notFound } from "../../lib/app-error";
import { addDays, localDate, startOfLocalDay } from "../../lib/clock";
import type { Caller } from "../../middleware/handle";
import { assertStewardOf } from "../../middleware/require-role";
import * as stateRepo from "./digester-state.repository";
import * as repo from "./digesters.repository";
import { findLedgerCaps } from "./ledger.repository";
import { findDailyReadings } from "./readings.repository";

/** A digester as its page shows it, with its stewards. */
export function toProfile(d: stateRepo.DigesterRow, stewards: { id: number; name: string }[]): DigesterProfile {
  return {
    id: d.id,
    name: d.name,
    siteDescription: d.siteDescription,
    status: d.status,
    statusReason: d.statusReason,
    location: { lat: d.lat, lng: d.lng },
    workingVolumeM3: d.workingVolumeM3,
    drumDiameterM: d.drumDiameterM,
    drumMassKg: d.drumMassKg,
    addedMassKg: d.addedMassKg,
    burnerLitresPerHour: d.burnerLitresPerHour,
    heating: d.heating as DigesterProfile["heating"],
    insulation: d.insulation as DigesterProfile["insulation"],
    startedOn: d.startedOn,
    gasFirstBurnedOn: d.gasFirstBurnedOn,
    olrRefKgVsPerM3Day: d.olrRefKgVsPerM3Day,
    olrOverrideReason: d.olrOverrideReason,
    targetTsPercent: d.targetTsPercent,
    bucketKgPerLitre: d.bucketKgPerLitre,
    stewards,
  };
}

/**
 * `PATCH /api/digesters/:id`: checked against the stored values too — a loading rate above
 * 2.0 kg VS/m³/d needs a recorded reason (DOMAIN.md §2 limit 1), and gas cannot first burn
 * before the start-up began.
 */
export async function updateProfile(
  caller: Caller,
  digesterId: number,
  input: UpdateDigesterProfileParsed,
): Promise<DigesterProfile> {
  assertStewardOf(caller, digesterId);
  return sequelize().transaction(async (t) => {
    const [current] = await stateRepo.findDigesters([digesterId], { transaction: t, lock: true });
    if (!current) throw notFound("This digester");
    const olrRef = input.olrRefKgVsPerM3Day ?? current.olrRefKgVsPerM3Day;
    const reason = input.olrOverrideReason !== undefined ? input.olrOverrideReason : current.olrOverrideReason;
    if (olrRef > OLR_REF_CAP_KG_VS_PER_M3_DAY && !(reason && reason.trim().length >= 3)) {
      throw badRequest("A loading rate above 2.0 needs a reason.", {
        olrOverrideReason: `Above ${OLR_REF_CAP_KG_VS_PER_M3_DAY} kg VS/m³/day, say why this digester can take more (heated, stirred, tested).`,
      });
    }
    const startedOn = input.startedOn ?? current.startedOn;
    const gasFirstBurnedOn = input.gasFirstBurnedOn !== undefined ? input.gasFirstBurnedOn : current.gasFirstBurnedOn;
    if (gasFirstBurnedOn !== null && gasFirstBurnedOn < startedOn) {
      throw badRequest("The gas cannot burn before the start.", {
        gasFirstBurnedOn: "Choose a day on or after the start date.",
      });
    }
    const today = localDate(new Date());
    if (startedOn > addDays(today, 365))
      throw badRequest("The start date is too far ahead.", { startedOn: "Choose a day within a year from now." });
    if (gasFirstBurnedOn !== null && gasFirstBurnedOn > today) {
      throw badRequest("The gas cannot have burned on a later day.", {
        gasFirstBurnedOn: "Choose today or an earlier day.",
      });
    }
    // A reason that no longer explains anything is cleared with the rate it justified.
    const fields = { ...input };
    if (
      olrRef <= OLR_REF_CAP_KG_VS_PER_M3_DAY &&
      input.olrRefKgVsPerM3Day !== undefined &&
      input.olrOverrideReason === undefined
    ) {
      fields.olrOverrideReason = null;
    }
    await repo.updateProfile(t, digesterId, fields);
    const [after] = await stateRepo.findDigesters([digesterId], { transaction: t });
    return toProfile(after!, await repo.findStewards(digesterId, { transaction: t }));
  });
}

/** `PUT /api/digesters/:id/status`: resting and offline carry a reason and take no drop-offs (their budget is 0). */
export async function setStatus(
  caller: Caller,
  digesterId: number,
  input: { status: "active" | "resting" | "offline"; reason: string | null },
) {
  assertStewardOf(caller, digesterId);
  return sequelize().transaction(async (t) => {
    const [current] = await stateRepo.findDigesters([digesterId], { transaction: t, lock: true });
    if (!current) throw notFound("This digester");
    await repo.setStatus(t, digesterId, input.status, input.status === "active" ? null : input.reason);
    const [after] = await stateRepo.findDigesters([digesterId], { transaction: t });
    return toProfile(after!, await repo.findStewards(digesterId, { transaction: t }));
  });
}

/** Mean daily load over the `days` days ending on `day` (kg VS). */
function trailingMean(loads: Map<string, number>, day: string, days: number): number {
  let total = 0;
  for (let i = 0; i < days; i += 1) total += loads.get(addDays(day, -i)) ?? 0;
  return total / days;
}

const round = (v: number | null, places: number) => (v === null ? null : Math.round(v * 10 ** places) / 10 ** places);

/** Days a temperature carries over when none was logged (DOMAIN.md §2: a reading counts for 48 h). */
const TEMPERATURE_CARRY_DAYS = 2;
/** Days of loading the steady-state gas model averages over. */
const GAS_MEAN_DAYS = 14;

/**
 * `GET /api/digesters/:id/history?days=60`: one row per day — the load (fed, and today also
 * accepted) against the organic-load limit at that day's temperature (OLRref × f(T) × V,
 * DOMAIN.md §2 limits 1–2) and the cap a steward's accept recorded; daily temperature and the
 * day's last pH; expected biogas from the 14-day mean load at that temperature (Chen–Hashimoto,
 * DOMAIN.md §3, an estimate).
 */
export async function digesterHistory(
  caller: Caller,
  digesterId: number,
  days: number,
  now = new Date(),
): Promise<DigesterHistory> {
  assertStewardOf(caller, digesterId);
  const [digester] = await stateRepo.findDigesters([digesterId]);
  if (!digester) throw notFound("This digester");
  const toDay = localDate(now);
  const fromDay = addDays(toDay, -(days - 1));
  const loadFrom = addDays(fromDay, -GAS_MEAN_DAYS);
  const [loads, readings, caps] = await Promise.all([
    stateRepo.findDailyLoads([digesterId], loadFrom, toDay),
    findDailyReadings(digesterId, startOfLocalDay(addDays(fromDay, -TEMPERATURE_CARRY_DAYS)), env().TIMEZONE),
    findLedgerCaps(digesterId, fromDay, toDay),
  ]);
  const loadKgVs = new Map<string, number>();
  const loadKgScraps = new Map<string, number>();
  for (const l of loads) {
    if (l.kind !== "committed") continue;
    loadKgVs.set(l.day, (loadKgVs.get(l.day) ?? 0) + l.kgVs);
    loadKgScraps.set(l.day, (loadKgScraps.get(l.day) ?? 0) + l.freshKg);
  }
  const readingByDay = new Map(readings.map((r) => [r.day, r]));
  const capByDay = new Map(caps.map((c) => [c.day, c.capKgVs]));
  const olrRef =
    digester.olrRefKgVsPerM3Day > OLR_REF_CAP_KG_VS_PER_M3_DAY && !digester.olrOverrideReason
      ? OLR_REF_CAP_KG_VS_PER_M3_DAY
      : digester.olrRefKgVsPerM3Day;

  const out: DigesterHistoryDay[] = [];
  for (let day = fromDay; day <= toDay; day = addDays(day, 1)) {
    const r = readingByDay.get(day);
    let temperature: number | null = r?.temperatureMeanC ?? null;
    for (let back = 1; temperature === null && back <= TEMPERATURE_CARRY_DAYS; back += 1) {
      temperature = readingByDay.get(addDays(day, -back))?.temperatureMeanC ?? null;
    }
    const meanLoad = trailingMean(loadKgVs, day, GAS_MEAN_DAYS);
    const gas =
      temperature === null
        ? null
        : expectedDailyGas({
            workingVolumeM3: digester.workingVolumeM3,
            loadingKgVsPerDay: meanLoad,
            temperatureC: temperature,
            targetTsPercent: digester.targetTsPercent,
          });
    const vs = loadKgVs.get(day) ?? 0;
    out.push({
      date: day,
      loadKgVs: round(vs, 3)!,
      loadKgScraps: round(loadKgScraps.get(day) ?? 0, 1)!,
      organicLimitKgVs:
        temperature === null ? null : round(olrRef * temperatureFactor(temperature) * digester.workingVolumeM3, 3),
      recordedCapKgVs: round(capByDay.get(day) ?? null, 3),
      temperatureMinC: round(r?.temperatureMinC ?? null, 1),
      temperatureMeanC: round(r?.temperatureMeanC ?? null, 1),
      temperatureMaxC: round(r?.temperatureMaxC ?? null, 1),
      ph: round(r?.ph ?? null, 2),
      expectedBiogasLitres: gas === null ? null : round(gas.biogasLitresPerDay as number, 0),
      gasUsedMinutes: round(r?.gasUsedMinutes ?? null, 0),
    });
  }
  return { digesterId, from: fromDay, to: toDay, days: out };
}
