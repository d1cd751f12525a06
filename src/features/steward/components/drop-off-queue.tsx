import { useState, type ReactNode } from "react";
import type { StewardDigesterDay, StewardDropOff } from "@shared/schemas/steward";
import { Alert, Badge, Button } from "@/components/ui";
import { ApiError } from "@/lib/api-client";
import { useDecideDropOff, type DropOffDecisionRequest } from "../api/decide-drop-off";
import { amountText, formatDay, formatNumber, mixLabel } from "../utils/format";
import { DecisionDialog, type DecisionDialogState } from "./decision-dialogs";

type Result = { variant: "success" | "danger"; title: string; text?: string };

const doneWords: Record<DropOffDecisionRequest["kind"], string> = {
  accept: "Accepted",
  feed: "Fed",
  "turn-away": "Turned away",
};

function DropOffItem({
  d,
  today,
  headingLevel,
  actions,
}: {
  d: StewardDropOff;
  today: string;
  headingLevel: 3 | 4 | 5;
  actions: ReactNode;
}) {
  const Heading = `h${headingLevel}` as const;
  return (
    <li className="flex flex-col gap-2 rounded-md border border-border bg-surface p-3">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <Heading className="text-lg font-bold">{d.householdName}</Heading>
        {d.fitsToday ? (
          <Badge tone="success">Fits today's budget</Badge>
        ) : (
          <Badge tone="warning">Beyond today's budget</Badge>
        )}
      </div>
      <p>
        {amountText(d)} · {mixLabel(d.mix)}
        {d.citrusPercent > 0 ? ` · ${formatNumber(d.citrusPercent, 0)} % citrus` : ""}
      </p>
      {d.citrusOverLimit ? (
        <p className="font-bold text-warning">More than 10 % citrus: citrus oil slows the gas-making microbes.</p>
      ) : null}
      {d.forDate !== today ? <p className="text-muted">Brought for {formatDay(d.forDate)}.</p> : null}
      {d.note ? <p className="text-muted">Household's note: “{d.note}”</p> : null}
      {d.overrideReason ? <p className="text-muted">Accepted beyond the budget: “{d.overrideReason}”</p> : null}
      <div className="flex flex-wrap gap-2">{actions}</div>
    </li>
  );
}

export type DropOffQueueProps = {
  day: StewardDigesterDay;
  today: string;
  /** Also refresh queries outside the steward's day (the digester page). */
  onChanged?: () => void;
  headingLevel?: 2 | 3 | 4;
};

/** Drop-offs waiting for a decision and accepted ones still to feed, with accept / feed / turn away. */
export function DropOffQueue({ day, today, onChanged, headingLevel = 3 }: DropOffQueueProps) {
  const Heading = `h${headingLevel}` as const;
  const itemLevel = (headingLevel + 1) as 3 | 4 | 5;
  const decide = useDecideDropOff(onChanged);
  const [dialog, setDialog] = useState<DecisionDialogState | null>(null);
  const [result, setResult] = useState<Result | null>(null);

  const send = async (request: DropOffDecisionRequest, dropOff: StewardDropOff) => {
    setResult(null);
    const answer = await decide.mutateAsync(request);
    const water = answer.feeding ? ` with ${formatNumber(answer.feeding.waterLitres)} L of water` : "";
    setResult({
      variant: "success",
      title: `${answer.feeding && request.kind === "accept" ? "Accepted and fed" : doneWords[request.kind]}: ${dropOff.householdName}`,
      text: `${amountText(dropOff)}${water}. Still welcome today: about ${formatNumber(answer.budget.budgetKgScraps)} kg.`,
    });
    return answer;
  };

  const acceptNow = async (d: StewardDropOff) => {
    if (!d.fitsToday) return setDialog({ type: "override", dropOff: d });
    try {
      await send({ kind: "accept", dropOffId: d.id, body: {} }, d);
    } catch (err) {
      if (err instanceof ApiError && err.status === 409 && err.fields.override)
        return setDialog({ type: "override", dropOff: { ...d, fitsToday: false } });
      setResult({
        variant: "danger",
        title: `Not accepted: ${d.householdName}`,
        text: err instanceof ApiError ? err.message : "Please try again.",
      });
    }
  };

  const closed = day.budget.closed;
  return (
    <section aria-label="Drop-offs" className="flex flex-col gap-3">
      <Heading className="text-xl font-bold">Drop-offs waiting ({day.waiting.length})</Heading>
      {result ? (
        <Alert
          variant={result.variant}
          title={result.title}
          announce={result.variant === "danger" ? "assertive" : "polite"}
        >
          {result.text ? <p>{result.text}</p> : null}
        </Alert>
      ) : null}
      {day.waiting.length === 0 ? (
        <p>Nothing is waiting.</p>
      ) : (
        <ul className="flex flex-col gap-2">
          {day.waiting.map((d) => (
            <DropOffItem
              key={d.id}
              d={d}
              today={today}
              headingLevel={itemLevel}
              actions={
                <>
                  {!closed ? (
                    <>
                      <Button type="button" size="sm" onClick={() => void acceptNow(d)}>
                        Accept<span className="sr-only"> the drop-off from {d.householdName}</span>
                      </Button>
                      <Button
                        type="button"
                        size="sm"
                        variant="outline"
                        onClick={() => setDialog({ type: "feed", dropOff: d, acceptFirst: true })}
                      >
                        Accept and feed<span className="sr-only"> the drop-off from {d.householdName}</span>
                      </Button>
                    </>
                  ) : null}
                  <Button
                    type="button"
                    size="sm"
                    variant="secondary"
                    onClick={() => setDialog({ type: "turn-away", dropOff: d })}
                  >
                    Turn away<span className="sr-only"> the drop-off from {d.householdName}</span>
                  </Button>
                </>
              }
            />
          ))}
        </ul>
      )}
      <Heading className="text-xl font-bold">Accepted, not yet fed ({day.accepted.length})</Heading>
      {day.accepted.length === 0 ? (
        <p>None.</p>
      ) : (
        <ul className="flex flex-col gap-2">
          {day.accepted.map((d) => (
            <DropOffItem
              key={d.id}
              d={d}
              today={today}
              headingLevel={itemLevel}
              actions={
                <>
                  {!closed ? (
                    <Button
                      type="button"
                      size="sm"
                      onClick={() => setDialog({ type: "feed", dropOff: d, acceptFirst: false })}
                    >
                      Feed<span className="sr-only"> the drop-off from {d.householdName}</span>
                    </Button>
                  ) : null}
                  <Button
                    type="button"
                    size="sm"
                    variant="secondary"
                    onClick={() => setDialog({ type: "turn-away", dropOff: d })}
                  >
                    Turn away<span className="sr-only"> the drop-off from {d.householdName}</span>
                  </Button>
                </>
              }
            />
          ))}
        </ul>
      )}
      <DecisionDialog
        state={dialog}
        onClose={() => setDialog(null)}
        decide={(request) => send(request, dialog!.dropOff)}
        pending={decide.isPending}
      />
    </section>
  );
}
