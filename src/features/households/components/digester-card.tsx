import { Link } from "react-router-dom";
import type { Household } from "@shared/schemas/households";
import { buttonClasses, Card, CardContent, CardDescription, CardHeader, CardTitle } from "@/components/ui";
import { paths } from "@/config/paths";

const metres = (m: number) =>
  m >= 1000 ? `${(m / 1000).toLocaleString("en-GB", { maximumFractionDigits: 1 })} km` : `${Math.round(m / 10) * 10} m`;

/** The digester the household brings its scraps to, and where that choice came from. */
export function DigesterCard({ household }: { household: Household }) {
  const d = household.digester;
  return (
    <Card>
      <CardHeader>
        <CardTitle>Your digester</CardTitle>
        <CardDescription>
          {d === null
            ? "No digester yet: add where your home is, or ask your coordinator."
            : d.source === "assigned"
              ? "Chosen for you by your coordinator."
              : "The nearest digester taking scraps, until your coordinator assigns one."}
        </CardDescription>
      </CardHeader>
      {d ? (
        <CardContent className="flex flex-col gap-3">
          <p className="text-2xl font-bold">{d.name}</p>
          {d.distanceM !== null ? <p>About {metres(d.distanceM)} from your home as the crow flies.</p> : null}
          <p>
            <Link to={paths.logDropOff(d.id)} className={buttonClasses("primary")}>
              Log a drop-off
            </Link>
          </p>
        </CardContent>
      ) : null}
    </Card>
  );
}
