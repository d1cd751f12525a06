import type { StewardBudget } from "@shared/schemas/steward";
import { Alert, Stat } from "@/components/ui";
import { formatNumber } from "../utils/format";

/** Today's room in kg and buckets, what is already in, and which limit binds, in words. */
export function BudgetPanel({ budget, headingLevel = 3 }: { budget: StewardBudget; headingLevel?: 2 | 3 | 4 }) {
  const Heading = `h${headingLevel}` as const;
  return (
    <section aria-label="Today's feed budget" className="flex flex-col gap-3">
      <Heading className="text-xl font-bold">Feed budget today</Heading>
      {budget.closed ? (
        <Alert variant="warning" title="Takes no scraps today" announce="off">
          <p>{budget.explanation}</p>
        </Alert>
      ) : null}
      <div className="grid gap-3 sm:grid-cols-3">
        <Stat
          label="Still welcome today"
          value={formatNumber(budget.budgetKgScraps)}
          unit="kg"
          hint={`About ${formatNumber(budget.budgetBuckets)} buckets of ${formatNumber(budget.bucketLitres)} L (${formatNumber(budget.budgetKgVs, 2)} kg VS)`}
        />
        <Stat
          label="Already in today"
          value={formatNumber(budget.committedKgScraps)}
          unit="kg"
          hint="Fed, or accepted and not yet fed"
        />
        <Stat
          label="Waiting for you"
          value={formatNumber(budget.pendingKgScraps)}
          unit="kg"
          hint="Drop-offs not yet accepted"
        />
      </div>
      {!budget.closed ? (
        <div className="rounded-md border border-border bg-surface-muted p-3">
          <p>
            <span className="font-bold">What limits today:</span> {budget.explanation}
          </p>
          <p className="mt-1 text-base text-muted">
            Dilution water: about {formatNumber(budget.dilutionWaterLitresPerKg)} L per kg of mixed scraps, down to{" "}
            {formatNumber(budget.targetTsPercent)} % solids.
          </p>
        </div>
      ) : null}
    </section>
  );
}
