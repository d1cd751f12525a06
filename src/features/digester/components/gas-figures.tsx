import {
  cookingMinutes,
  ESTIMATES_STATEMENT,
  floatingDrumPressure,
  GAS_CAUTIONS,
  PRESSURE_CAUTIONS,
} from "@shared/domain";
import type { DigesterHistory, DigesterProfile } from "@shared/schemas/digester";
import { Caution, Stat } from "@/components/ui";
import { formatNumber } from "../utils/format";

/** Expected gas today, the cooking time it gives, and the gas-holder pressure, with the safety cautions beside them. */
export function GasFigures({ profile, history }: { profile: DigesterProfile; history: DigesterHistory }) {
  const today = history.days.at(-1);
  const litres = today?.expectedBiogasLitres ?? null;
  const pressure =
    profile.drumDiameterM !== null && profile.drumMassKg !== null
      ? floatingDrumPressure({
          drumDiameterM: profile.drumDiameterM,
          drumMassKg: profile.drumMassKg,
          addedMassKg: profile.addedMassKg,
        })
      : null;
  return (
    <div className="grid grid-cols-[minmax(0,1fr)] gap-4 lg:grid-cols-[minmax(0,2fr)_minmax(0,3fr)]">
      <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-1">
        <Stat
          label="Expected biogas today (estimate)"
          value={formatNumber(litres, 0)}
          unit="litres"
          hint={
            litres === null
              ? "Log a temperature to get an estimate."
              : "From the last 14 days' load and today's temperature."
          }
        />
        <Stat
          label="Cooking time it gives"
          value={litres === null ? "—" : formatNumber(cookingMinutes(litres, profile.burnerLitresPerHour), 0)}
          unit="minutes"
          hint={`At a burner flow of ${formatNumber(profile.burnerLitresPerHour, 0)} L/h.`}
        />
        <Stat
          label="Gas-holder pressure"
          value={pressure === null ? "—" : formatNumber(pressure.pressureMbar, 1)}
          unit="mbar"
          hint={
            pressure === null
              ? "Give the drum's diameter and mass in the settings."
              : `${formatNumber(pressure.pressureMmWc, 0)} mm water column, from the drum (${formatNumber(profile.drumMassKg, 0)} kg) and added weights (${formatNumber(profile.addedMassKg, 0)} kg).`
          }
        />
      </div>
      <Caution
        items={[...GAS_CAUTIONS, ...PRESSURE_CAUTIONS]}
        title="Safety with gas and pressure"
        headingLevel={3}
        closing={ESTIMATES_STATEMENT}
      />
    </div>
  );
}
