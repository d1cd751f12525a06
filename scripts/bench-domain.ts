/**
 * Evaluations per second of the feed budget and the gas model.
 * Run: node --import tsx scripts/bench-domain.ts
 * Prints figures only; it is not a timed test.
 */
import { performance } from "node:perf_hooks";
import { computeFeedBudget, type FeedBudgetInput } from "../shared/domain/feed-budget";
import { chenHashimotoMethane, expectedDailyGas } from "../shared/domain/gas";

// A fixed, varied set of inputs so the JIT cannot fold one call away.
function makeFeedInputs(count: number): FeedBudgetInput[] {
  const inputs: FeedBudgetInput[] = [];
  for (let i = 0; i < count; i++) {
    inputs.push({
      workingVolumeM3: 0.5 + (i % 20) * 0.5,
      temperatureC: i % 17 === 0 ? null : 8 + (i % 30),
      olrRefKgVsPerM3Day: 1 + (i % 5) * 0.2,
      daysSinceStart: i % 7 === 0 ? i % 60 : null,
      gasBurns: i % 11 !== 0,
      ph: i % 5 === 0 ? undefined : 6.3 + (i % 12) * 0.1,
      vfaTaRatio: i % 3 === 0 ? undefined : 0.2 + (i % 8) * 0.06,
      fedKgVsPrevious7Days: i % 4 === 0 ? undefined : [1, 1.2, 0, 1.5, 1.1, 0.9, 1.3].map((v) => v * (1 + (i % 3))),
      fedTodayKgVs: (i % 4) * 0.3,
      bucketLitres: 10,
    });
  }
  return inputs;
}

function bench(label: string, runs: number, body: (i: number) => number): void {
  let sink = 0;
  for (let i = 0; i < Math.min(runs, 20_000); i++) sink += body(i); // warm-up
  const start = performance.now();
  for (let i = 0; i < runs; i++) sink += body(i);
  const elapsedMs = performance.now() - start;
  const perSecond = (runs / elapsedMs) * 1000;
  console.log(
    `${label.padEnd(34)} ${Math.round(perSecond).toLocaleString("en-GB").padStart(12)} evaluations/s  (${runs.toLocaleString("en-GB")} in ${elapsedMs.toFixed(0)} ms; checksum ${sink.toFixed(3)})`,
  );
}

const feedInputs = makeFeedInputs(1024);
const runs = Number(process.argv[2] ?? 200_000);

console.log(`Node ${process.version}, ${runs.toLocaleString("en-GB")} runs each`);
bench("computeFeedBudget", runs, (i) => computeFeedBudget(feedInputs[i % feedInputs.length]!).budgetKgVs);
bench(
  "chenHashimotoMethane",
  runs,
  (i) =>
    chenHashimotoMethane({
      b0M3PerKgVs: 0.4,
      s0KgVsPerM3: 20 + (i % 80),
      retentionDays: 10 + (i % 120),
      temperatureC: 5 + (i % 50),
    }).methaneM3PerM3Day,
);
bench(
  "expectedDailyGas",
  runs,
  (i) =>
    expectedDailyGas({
      workingVolumeM3: 0.5 + (i % 20) * 0.5,
      loadingKgVsPerDay: 0.2 + (i % 15) * 0.2,
      temperatureC: 5 + (i % 40),
    }).biogasM3PerDay,
);
