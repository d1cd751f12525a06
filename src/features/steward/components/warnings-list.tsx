import type { FeedWarningDto } from "@shared/schemas/calc";
import { Alert, type AlertVariant } from "@/components/ui";

const severity: Record<FeedWarningDto["severity"], { variant: AlertVariant; word: string }> = {
  stop: { variant: "danger", word: "Stop" },
  caution: { variant: "warning", word: "Caution" },
  info: { variant: "info", word: "Note" },
};

/** The budget's warnings, most severe first, each with the steps to take. */
export function WarningsList({ warnings, headingLevel = 3 }: { warnings: FeedWarningDto[]; headingLevel?: 2 | 3 | 4 }) {
  const Heading = `h${headingLevel}` as const;
  const order = { stop: 0, caution: 1, info: 2 } as const;
  const sorted = [...warnings].sort((a, b) => order[a.severity] - order[b.severity]);
  return (
    <section aria-label="Warnings" className="flex flex-col gap-2">
      <Heading className="text-xl font-bold">Warnings</Heading>
      {sorted.length === 0 ? (
        <p>No warnings: the readings look fine.</p>
      ) : (
        <ul className="flex flex-col gap-2">
          {sorted.map((w) => (
            <li key={w.code}>
              <Alert
                variant={severity[w.severity].variant}
                title={`${severity[w.severity].word}: ${w.message}`}
                announce="off"
              >
                {w.actions.length > 0 ? (
                  <>
                    <p className="font-bold">What to do</p>
                    <ol className="list-decimal pl-6">
                      {w.actions.map((action) => (
                        <li key={action}>{action}</li>
                      ))}
                    </ol>
                  </>
                ) : null}
              </Alert>
            </li>
          ))}
        </ul>
      )}
    </section>
  );
}
