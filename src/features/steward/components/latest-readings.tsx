import { Clock, TriangleExclamationPoint } from "lucide-react";
import type { LatestReadings, LatestValue } from "@shared/schemas/steward";
import { formatAge, formatDateTime, formatNumber } from "../utils/format";

function Row({
  label,
  reading,
  unit,
  decimals,
  staleHint,
}: {
  label: string;
  reading: LatestValue;
  unit: string;
  decimals: number;
  staleHint: string;
}) {
  return (
    <div className="flex flex-col gap-0.5 border-b border-border py-2 last:border-b-0 sm:flex-row sm:items-baseline sm:gap-3">
      <dt className="font-bold sm:w-48">{label}</dt>
      <dd className="flex flex-col">
        {reading === null ? (
          <span>Never logged</span>
        ) : (
          <>
            <span>
              <span className="text-xl font-bold tabular-nums">
                {formatNumber(reading.value, decimals)}
                {unit}
              </span>{" "}
              <span className="text-muted">
                <Clock aria-hidden="true" className="inline size-4 align-[-2px]" /> {formatAge(reading.ageHours)} (
                {formatDateTime(reading.takenAt)})
              </span>
            </span>
            {reading.stale ? (
              <span className="flex items-center gap-1 font-bold text-warning">
                <TriangleExclamationPoint aria-hidden="true" className="size-5 shrink-0" />
                Too old: {staleHint}
              </span>
            ) : null}
          </>
        )}
      </dd>
    </div>
  );
}

/** The last reading of each kind, how old it is, and a flag once it no longer counts for the budget. */
export function LatestReadingsList({
  readings,
  headingLevel = 3,
}: {
  readings: LatestReadings;
  headingLevel?: 2 | 3 | 4;
}) {
  const Heading = `h${headingLevel}` as const;
  return (
    <section aria-label="Last readings" className="flex flex-col gap-1">
      <Heading className="text-xl font-bold">Last readings</Heading>
      <dl>
        <Row
          label="Digester temperature"
          reading={readings.temperatureC}
          unit=" °C"
          decimals={1}
          staleHint="the budget counts a temperature for 48 hours. Log a new one."
        />
        <Row
          label="pH"
          reading={readings.ph}
          unit=""
          decimals={2}
          staleHint="pH counts for 7 days. Measure it again."
        />
        <Row
          label="Acids/alkalinity (FOS/TAC)"
          reading={readings.vfaTaRatio}
          unit=""
          decimals={2}
          staleHint="the ratio counts for 7 days. Titrate again when you can."
        />
        <Row
          label="Gas-holder level"
          reading={readings.gasLevelPercent}
          unit=" %"
          decimals={0}
          staleHint="more than a day old."
        />
      </dl>
    </section>
  );
}
