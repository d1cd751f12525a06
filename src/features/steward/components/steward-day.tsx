import { useId, useState } from "react";
import { Link } from "react-router-dom";
import { DIGESTER_STATUS_WORDS } from "../utils/status";
import type { StewardDigesterDay } from "@shared/schemas/steward";
import { Alert, Badge, Button, buttonClasses, Card, CardContent, CardHeader, Dialog } from "@/components/ui";
import { paths } from "@/config/paths";
import { BudgetPanel } from "./budget-panel";
import { DropOffQueue } from "./drop-off-queue";
import { FedToday } from "./fed-today";
import { HandFeedingForm } from "./hand-feeding-form";
import { LatestReadingsList } from "./latest-readings";
import { ReadingForm } from "./reading-form";
import { WarningsList } from "./warnings-list";

export type StewardDayPanelProps = {
  day: StewardDigesterDay;
  today: string;
  /** Refresh queries outside the steward's day after a change (the digester page). */
  onChanged?: () => void;
  /** Level of the panel's section headings. */
  headingLevel?: 2 | 3;
};

/** One digester's day: budget, warnings, drop-offs, what was fed, last readings, and the steward's actions. */
export function StewardDayPanel({ day, today, onChanged, headingLevel = 3 }: StewardDayPanelProps) {
  const [open, setOpen] = useState<"reading" | "feeding" | null>(null);
  const [notice, setNotice] = useState<string | null>(null);
  const Heading = `h${headingLevel}` as const;
  const saved = (message: string) => {
    setOpen(null);
    setNotice(message);
  };
  return (
    <div className="flex flex-col gap-6">
      {notice ? <Alert variant="success" title={notice} /> : null}
      <div className="grid gap-6 lg:grid-cols-2">
        <BudgetPanel budget={day.budget} headingLevel={headingLevel} />
        <WarningsList warnings={day.budget.warnings} headingLevel={headingLevel} />
      </div>
      <DropOffQueue day={day} today={today} onChanged={onChanged} headingLevel={headingLevel} />
      <section aria-label="Fed today" className="flex flex-col gap-3">
        <Heading className="text-xl font-bold">Fed today</Heading>
        <FedToday feedings={day.fedToday} digesterName={day.name} />
        {!day.budget.closed ? (
          <div>
            <Button type="button" variant="outline" onClick={() => setOpen("feeding")}>
              Add scraps by hand<span className="sr-only"> to {day.name}</span>
            </Button>
          </div>
        ) : null}
      </section>
      <div className="flex flex-col gap-3">
        <LatestReadingsList readings={day.readings} headingLevel={headingLevel} />
        <div>
          <Button type="button" variant="outline" onClick={() => setOpen("reading")}>
            Log a reading<span className="sr-only"> for {day.name}</span>
          </Button>
        </div>
      </div>
      <Dialog
        open={open === "reading"}
        onClose={() => setOpen(null)}
        title={`Log a reading: ${day.name}`}
        className="max-w-2xl"
      >
        <ReadingForm digesterId={day.id} digesterName={day.name} onChanged={onChanged} onSaved={saved} />
      </Dialog>
      <Dialog
        open={open === "feeding"}
        onClose={() => setOpen(null)}
        title={`Add scraps by hand: ${day.name}`}
        className="max-w-2xl"
      >
        <HandFeedingForm
          digesterId={day.id}
          digesterName={day.name}
          budget={day.budget}
          onChanged={onChanged}
          onSaved={saved}
        />
      </Dialog>
    </div>
  );
}

/** The today page's card for one digester. */
export function StewardDayCard({ day, today }: { day: StewardDigesterDay; today: string }) {
  const headingId = useId();
  const status = DIGESTER_STATUS_WORDS[day.status];
  return (
    <Card role="region" aria-labelledby={headingId}>
      <CardHeader className="flex-row flex-wrap items-center justify-between gap-3">
        <div className="flex flex-wrap items-center gap-3">
          <h2 id={headingId} className="text-2xl font-bold">
            {day.name}
          </h2>
          <Badge tone={status.tone}>{status.label}</Badge>
        </div>
        <Link to={paths.digester(day.id)} className={buttonClasses("ghost", "sm")}>
          Charts, records and settings<span className="sr-only"> of {day.name}</span>
        </Link>
      </CardHeader>
      <CardContent>
        {day.statusReason && day.status !== "active" ? <p className="mb-4">Reason: {day.statusReason}</p> : null}
        <StewardDayPanel day={day} today={today} />
      </CardContent>
    </Card>
  );
}
