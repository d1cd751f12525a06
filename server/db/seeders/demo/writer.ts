/**
 * The writer: inserts a built demo neighbourhood, one step per kind of row, in one
 * transaction (the caller's). Steps run in the order of {@link DEMO_WRITE_STEPS}; each turns
 * the demo's string keys into the row ids the steps before it remembered.
 *
 * To add demo data (another table, more rows): write one file that builds its rows from
 * `context.demo` and `context.clock` and exports a {@link DemoWriteStep} that inserts them,
 * and add that step to the list below.
 */
import type { Transaction } from "sequelize";
import { dropOffQuantities } from "../../../../shared/domain/drop-offs";
import { models } from "../../models";
import { makeClock } from "./clock";
import { round } from "./numbers";
import type { DemoNeighbourhood } from "./types";
import { DemoIds, type DemoWriteContext, type DemoWriteStep } from "./write-context";

const writeDigesters: DemoWriteStep = async ({ demo, m, transaction, ids, bucketKgPerLitre }) => {
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
  ids.remember(
    "digester",
    demo.digesters.map((d) => d.key),
    digesterRows,
  );
  for (const d of digesterRows) bucketKgPerLitre.set(d.id, Number(d.bucketKgPerLitre));
};

const writeHouseholds: DemoWriteStep = async ({ demo, m, transaction, ids }) => {
  const householdRows = await m.Household.bulkCreate(
    demo.households.map((h) => ({
      name: h.name,
      addressText: h.addressText,
      lat: h.lat,
      lng: h.lng,
      assignedDigesterId: h.assignedDigesterKey ? ids.of("digester", h.assignedDigesterKey) : null,
      declaredWeeklyKg: h.declaredWeeklyKg,
    })),
    { transaction, returning: true },
  );
  ids.remember(
    "household",
    demo.households.map((h) => h.key),
    householdRows,
  );
};

const writePeople: DemoWriteStep = async ({ demo, m, transaction, ids, passwordHash }) => {
  const personRows = await m.Person.bulkCreate(
    demo.people.map((p) => ({
      email: p.email,
      name: p.name,
      passwordHash,
      status: "active" as const,
      roles: p.roles,
      householdId: p.householdKey ? ids.of("household", p.householdKey) : null,
      isVolunteer: p.isVolunteer,
      bikeLoadKg: p.bikeLoadKg,
      startLat: p.startLat,
      startLng: p.startLng,
      passwordChangedAt: null,
    })),
    { transaction, returning: true },
  );
  ids.remember(
    "person",
    demo.people.map((p) => p.key),
    personRows,
  );
};

const writeDigesterStewards: DemoWriteStep = async ({ demo, m, transaction, ids }) => {
  await m.DigesterSteward.bulkCreate(
    demo.digesters.flatMap((d) =>
      d.stewardKeys.map((k) => ({ digesterId: ids.of("digester", d.key), personId: ids.of("person", k) })),
    ),
    { transaction },
  );
};

const writeDropOffs: DemoWriteStep = async ({
  demo,
  m,
  transaction,
  ids,
  bucketKgPerLitre,
  dropOffQuantities: quantities,
}) => {
  const dropOffRows = await m.DropOff.bulkCreate(
    demo.dropOffs.map((d) => {
      const digester = ids.of("digester", d.digesterKey);
      const q = dropOffQuantities({
        bucketCount: d.weightKg === null ? d.bucketCount : null,
        bucketLitres: d.weightKg === null ? d.bucketLitres : null,
        weightKg: d.weightKg,
        mix: d.mix,
        citrusPercent: d.citrusPercent,
        kgPerLitre: bucketKgPerLitre.get(digester),
      });
      quantities.set(d.key, q);
      const createdAt = new Date(d.createdAt);
      return {
        householdId: ids.of("household", d.householdKey),
        digesterId: digester,
        personId: ids.of("person", d.personKey),
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
  ids.remember(
    "dropOff",
    demo.dropOffs.map((d) => d.key),
    dropOffRows,
  );
};

/** The demo's stewards feed at 18:00 local time. */
function feedingTimeOn(isoDate: string): Date {
  const [y, mo, d] = isoDate.split("-").map(Number) as [number, number, number];
  return new Date(y, mo - 1, d, 18, 0, 0);
}

// The demo feeds once a day per digester; the schema links one feeding row per drop-off,
// so each day's feeding is split by drop-off (water shared by fresh mass), with any
// remainder logged as scraps added by hand.
const writeFeedings: DemoWriteStep = async ({ demo, m, transaction, ids, dropOffQuantities: quantities }) => {
  const feedingRows = demo.feedings.flatMap((f) => {
    const digester = ids.of("digester", f.digesterKey);
    const fedAt = feedingTimeOn(f.fedOn);
    const parts = f.dropOffKeys.map((k) => {
      const q = quantities.get(k);
      if (!q) throw new Error(`demo data: feeding ${f.key} takes in ${k}, which was not written`);
      return { key: k as string | null, q };
    });
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
      dropOffId: p.key ? ids.of("dropOff", p.key) : null,
      personId: ids.of("person", f.personKey),
      overrideReason: null,
      note: p.key ? null : f.note,
      createdAt: fedAt,
    }));
  });
  await m.Feeding.bulkCreate(feedingRows, { transaction });
};

const writeReadings: DemoWriteStep = async ({ demo, m, transaction, ids }) => {
  await m.Reading.bulkCreate(
    demo.readings.map((r) => ({
      digesterId: ids.of("digester", r.digesterKey),
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
      personId: ids.of("person", r.personKey),
    })),
    { transaction },
  );
};

const writeCollectionRequests: DemoWriteStep = async ({ demo, m, transaction, ids }) => {
  await m.CollectionRequest.bulkCreate(
    demo.collectionRequests.map((c) => ({
      householdId: ids.of("household", c.householdKey),
      forDate: c.forDate,
      bucketCount: c.bucketCount,
      status: "open" as const,
    })),
    { transaction },
  );
};

const writeFertiliserClaims: DemoWriteStep = async ({ demo, m, transaction, ids }) => {
  await m.FertiliserClaim.bulkCreate(
    demo.fertiliserClaims.map((c) => ({
      digesterId: ids.of("digester", c.digesterKey),
      personId: ids.of("person", c.personKey),
      litres: c.litres,
      windowStart: new Date(c.windowStart),
      windowEnd: new Date(c.windowEnd),
      bedAreaM2: c.bedAreaM2,
      status: c.status,
    })),
    { transaction },
  );
};

/** Every step, in insertion order: a step may use the ids of those above it. */
export const DEMO_WRITE_STEPS: readonly DemoWriteStep[] = [
  writeDigesters,
  writeHouseholds,
  writePeople,
  writeDigesterStewards,
  writeDropOffs,
  writeFeedings,
  writeReadings,
  writeCollectionRequests,
  writeFertiliserClaims,
];

/** Inserts `demo` (built for `today`) inside `transaction`. */
export async function writeDemo(
  demo: DemoNeighbourhood,
  today: Date,
  passwordHash: string,
  transaction: Transaction,
): Promise<void> {
  const context: DemoWriteContext = {
    demo,
    clock: makeClock(today),
    m: models(),
    transaction,
    passwordHash,
    ids: new DemoIds(),
    bucketKgPerLitre: new Map(),
    dropOffQuantities: new Map(),
  };
  for (const step of DEMO_WRITE_STEPS) await step(context);
}
