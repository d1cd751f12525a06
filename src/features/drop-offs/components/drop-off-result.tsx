import { useEffect, useRef } from "react";
import { Link } from "react-router-dom";
import type { CreatedDropOff } from "@shared/schemas/drop-offs";
import { Alert, Button, buttonClasses } from "@/components/ui";
import { paths } from "@/config/paths";
import { amountText, dayText, mixLabels } from "../utils/labels";

/** What the server said about the logged drop-off: logged, and whether the digester welcomes it. */
export function DropOffResult({ created, onAnother }: { created: CreatedDropOff; onAnother: () => void }) {
  const headingRef = useRef<HTMLHeadingElement>(null);
  useEffect(() => headingRef.current?.focus(), []);
  const w = created.welcome;
  return (
    <section aria-labelledby="drop-off-logged" className="flex flex-col gap-4">
      <h2 id="drop-off-logged" ref={headingRef} tabIndex={-1} className="text-2xl font-bold focus:outline-none">
        Drop-off logged
      </h2>
      <p>
        {amountText(created)} of {mixLabels[created.mix].toLowerCase()} for <strong>{created.digesterName}</strong>,{" "}
        {w.basis === "tomorrow" ? `tomorrow (${dayText(created.forDate)})` : "today"}. The steward will check it when
        you bring it.
      </p>
      <Alert
        variant={w.welcomed ? "success" : "warning"}
        title={w.welcomed ? (w.basis === "tomorrow" ? "Logged for tomorrow" : "Welcome today") : "No room for it today"}
      >
        <p>{w.message}</p>
      </Alert>
      <div className="flex flex-wrap gap-2">
        <Link to={paths.dropOffs()} className={buttonClasses("primary")}>
          See your drop-offs
        </Link>
        <Button type="button" variant="outline" onClick={onAnother}>
          Log another drop-off
        </Button>
      </div>
    </section>
  );
}
