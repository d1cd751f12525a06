/**
 * Seeds the invented Larkmoor demo neighbourhood into an empty database (demo mode only).
 * All-or-nothing: one transaction.
 */
import { QueryTypes, type Transaction } from "sequelize";
import { sequelize } from "../sequelize";
import { models } from "../models";
import { hashPassword } from "../../lib/password";
import { dropOffQuantities } from "../../../shared/domain/drop-offs";
import { buildDemoNeighbourhood, type DemoNeighbourhood } from "./demo-data";

export const DEMO_PASSWORD = "hearthloop-demo";

/** Seeds when no person exists yet; returns whether it seeded. */
export async function seedDemoIfEmpty(today: Date): Promise<boolean> {
  const db = sequelize();
  const [row] = await db.query<{ n: number }>("SELECT count(*)::int AS n FROM people", { type: QueryTypes.SELECT });
  if ((row?.n ?? 0) > 0) return false;
  const demo = buildDemoNeighbourhood(today);
  const passwordHash = await hashPassword(DEMO_PASSWORD);
  await db.transaction(async (transaction) => {
    // Two concurrent first starts must not both seed.
    await db.query("LOCK TABLE people IN EXCLUSIVE MODE", { transaction });
    const [again] = await db.query<{ n: number }>("SELECT count(*)::int AS n FROM people", {
      type: QueryTypes.SELECT,
      transaction,
    });
    if ((again?.n ?? 0) > 0) return;
    await insertDemo(demo, passwordHash, transaction);
  });
  return true;
}

function localNoonOf(isoDate: string, hour = 18): Date {
  const [y, m, d] = isoDate.split("-").map(Number) as [number, number, number];
  return new Date(y, m - 1, d, hour, 0, 0);
}

async function insertDemo(demo: DemoNeighbourhood, passwordHash: string, transaction: Transaction) {
  const m = models();

  const digesterRows = await m.Digester.bulkCreate(
    demo.digesters.map((d) => ({
      name: d.name,
      siteDescription: d.siteDescription,
      lat: d.lat,
      lng: d.lng,
      workingVolumeM3: d.workingVolumeM3,
      drumDiameterM: d.drumDiameterM,
      drumMassKg: d.drumMassKg,
      addedMassKg: d.addedMassKg,
      burnerLitresPerHour: d.burnerLitresPerHour,
      heating: d.heating,
      insulation: d.insulation,
      status: d.status,
      statusReason: d.statusReason,
      startedOn: d.startedOn,
      gasFirstBurnedOn: d.gasFirstBurnedOn,
      olrRefKgVsPerM3Day: d.olrRefKgVsPerM3Day,
      olrOverrideReason: null,
    })),
    { transaction, returning: true },
  );
  const digesterId = new Map(demo.digesters.map((d, i) => [d.key, digesterRows[i]!.id]));
  const kgPerLitre = new Map(digesterRows.map((d) => [d.id, Number(d.bucketKgPerLitre)]));

  const householdRows = await m.Household.bulkCreate(
    demo.households.map((h) => ({
      name: h.name,
      addressText: h.addressText,
      lat: h.lat,
      lng: h.lng,
      assignedDigesterId: h.assignedDigesterKey ? digesterId.get(h.assignedDigesterKey)! : null,
      declaredWeeklyKg: h.declaredWeeklyKg,
    })),
    { transaction, returning: true },
  );
  const householdId = new Map(demo.households.map((h, i) => [h.key, householdRows[i]!.id]));

  const personRows = await m.Person.bulkCreate(
    demo.people.map((p) => ({
      email: p.email,
      name: p.name,
      passwordHash,
      status: "active" as const,
      roles: p.roles,
      householdId: p.householdKey ? householdId.get(p.householdKey)! : null,
      isVolunteer: p.isVolunteer,
      bikeLoadKg: p.bikeLoadKg,
      startLat: p.startLat,
      startLng: p.startLng,
      passwordChangedAt: null,
    })),
    { transaction, returning: true },
  );
  const personId = new Map(demo.people.map((p, i) => [p.key, personRows[i]!.id]));

  await m.DigesterSteward.bulkCreate(
    demo.digesters.flatMap((d) =>
      d.stewardKeys.map((k) => ({ digesterId: digesterId.get(d.key)!, personId: personId.get(k)! })),
    ),
    { transaction },
  );

  const dropOffQuantitiesByKey = new Map<string, ReturnType<typeof dropOffQuantities>>();
  const dropOffRows = await m.DropOff.bulkCreate(
    demo.dropOffs.map((d) => {
      const digester = digesterId.get(d.digesterKey)!;
      const q = dropOffQuantities({
        bucketCount: d.weightKg === null ? d.bucketCount : null,
        bucketLitres: d.weightKg === null ? d.bucketLitres : null,
        weightKg: d.weightKg,
        mix: d.mix,
        citrusPercent: d.citrusPercent,
        kgPerLitre: kgPerLitre.get(digester),
      });
      dropOffQuantitiesByKey.set(d.key, q);
      const createdAt = new Date(d.createdAt);
      return {
        householdId: householdId.get(d.householdKey)!,
        digesterId: digester,
        personId: personId.get(d.personKey)!,
        forDate: d.forDate,
        bucketCount: d.bucketCount,
        bucketLitres: d.bucketLitres,
        weightKg: d.weightKg,
        massSource: q.massSource,
        freshKg: round(q.freshKg, 3),
        kgVs: round(q.kgVs, 4),
        mix: d.mix,
        citrusPercent: d.citrusPercent,
        status: d.status,
        turnedAwayReason: d.turnedAwayReason,
        note: d.note,
        createdAt,
        updatedAt: createdAt,
      };
    }),
    { transaction, returning: true },
  );
  const dropOffId = new Map(demo.dropOffs.map((d, i) => [d.key, dropOffRows[i]!.id]));

  // The demo feeds once a day per digester; the schema links one feeding row per drop-off,
  // so each day's feeding is split by drop-off (water shared by fresh mass), with any
  // remainder logged as scraps added by hand.
  const feedingRows = demo.feedings.flatMap((f) => {
    const digester = digesterId.get(f.digesterKey)!;
    const fedAt = localNoonOf(f.fedOn);
    const parts = f.dropOffKeys.map((k) => ({ key: k as string | null, q: dropOffQuantitiesByKey.get(k)! }));
    const linkedKg = parts.reduce((s, p) => s + p.q.freshKg, 0);
    if (f.freshKg - linkedKg > 0.05) {
      parts.push({ key: null, q: dropOffQuantities({ weightKg: f.freshKg - linkedKg }) });
    }
    const totalKg = parts.reduce((s, p) => s + p.q.freshKg, 0) || 1;
    return parts.map((p) => ({
      digesterId: digester,
      fedOn: f.fedOn,
      fedAt,
      freshKg: round(p.q.freshKg, 3),
      kgVs: round(p.q.kgVs, 4),
      waterLitres: round((f.waterLitres * p.q.freshKg) / totalKg, 2),
      dropOffId: p.key ? dropOffId.get(p.key)! : null,
      personId: personId.get(f.personKey)!,
      overrideReason: null,
      note: p.key ? null : f.note,
      createdAt: fedAt,
    }));
  });
  await m.Feeding.bulkCreate(feedingRows, { transaction });

  await m.Reading.bulkCreate(
    demo.readings.map((r) => ({
      digesterId: digesterId.get(r.digesterKey)!,
      takenAt: new Date(r.takenAt),
      temperatureC: r.temperatureC,
      ph: r.ph,
      vfaTaRatio: r.vfaTaRatio,
      titrationAMl: null,
      titrationBMl: null,
      gasLevelPercent: r.gasLevelPercent,
      drumRiseM: null,
      gasUsedMinutes: r.gasUsedMinutes,
      note: r.note,
      source: "manual" as const,
      personId: personId.get(r.personKey)!,
    })),
    { transaction },
  );

  await m.CollectionRequest.bulkCreate(
    demo.collectionRequests.map((c) => ({
      householdId: householdId.get(c.householdKey)!,
      forDate: c.forDate,
      bucketCount: c.bucketCount,
      status: "open" as const,
    })),
    { transaction },
  );

  await m.FertiliserClaim.bulkCreate(
    demo.fertiliserClaims.map((c) => ({
      digesterId: digesterId.get(c.digesterKey)!,
      personId: personId.get(c.personKey)!,
      litres: c.litres,
      windowStart: new Date(c.windowStart),
      windowEnd: new Date(c.windowEnd),
      bedAreaM2: c.bedAreaM2,
      status: c.status,
    })),
    { transaction },
  );
}

function round(value: number, places: number) {
  const f = 10 ** places;
  return Math.round(value * f) / f;
}
