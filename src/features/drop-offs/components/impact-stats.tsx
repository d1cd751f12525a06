import type { HouseholdImpact } from "@shared/schemas/households";
import { Stat } from "@/components/ui";
import { dayText } from "../utils/labels";

const format = (v: number, digits = 1) => new Intl.NumberFormat("en-GB", { maximumFractionDigits: digits }).format(v);

function duration(minutes: number): { value: string; unit: string } {
  if (minutes < 120) return { value: format(minutes, 0), unit: "min" };
  return { value: format(minutes / 60, 1), unit: "hours" };
}

/** The household's totals as stat cards with units, and the one-sentence method behind the estimates. */
export function ImpactStats({ impact }: { impact: HouseholdImpact }) {
  const cooking = duration(impact.cookingMinutes);
  const since = impact.firstFedOn ? ` since ${dayText(impact.firstFedOn)}` : "";
  return (
    <section aria-labelledby="impact-heading" className="flex flex-col gap-4">
      <h2 id="impact-heading" className="text-2xl font-bold">
        What your scraps became
      </h2>
      <div className="grid gap-4 sm:grid-cols-2 lg:grid-cols-4">
        <Stat
          label="Scraps kept out of the bin"
          value={format(impact.fedFreshKg)}
          unit="kg"
          hint={`${impact.counts.fed} ${impact.counts.fed === 1 ? "drop-off" : "drop-offs"} fed to a digester${since}`}
        />
        <Stat label="Biogas they gave, up to" value={format(impact.biogasM3, 2)} unit="m³" hint="An estimate" />
        <Stat
          label="Cooking time, up to"
          value={cooking.value}
          unit={cooking.unit}
          hint={`On a ${impact.method.burnerLitresPerHour} L/h burner`}
        />
        <Stat
          label="Liquid fertiliser made"
          value={format(impact.digestateLitres)}
          unit="litres"
          hint="Digestate for gardens, an estimate"
        />
      </div>
      <p className="max-w-prose text-base text-muted">{impact.method.sentence}</p>
    </section>
  );
}
