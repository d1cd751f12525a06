import { GasHolderRequestSchema } from "@shared/schemas/calc";
import { DEFAULT_BURNER_LITRES_PER_HOUR } from "@shared/domain";
import { useGasHolderCalculation } from "../api/calc-gas-holder";
import { formatNumber } from "../utils/numbers";
import { CalculatorForm, type NumberFieldSpec } from "./calculator-form";
import { ResultPanel } from "./result-panel";

export const drumFields: NumberFieldSpec[] = [
  { name: "drumDiameterM", label: "Drum diameter (m)", hint: "Measure across the floating drum.", required: true },
  {
    name: "drumMassKg",
    label: "Drum mass (kg)",
    hint: "From the supplier, or weigh it before fitting.",
    required: true,
  },
];

const fields: NumberFieldSpec[] = [
  ...drumFields,
  { name: "addedMassKg", label: "Weights on the drum (kg)", hint: "Leave empty if there are none." },
  { name: "drumRiseM", label: "How far the drum has risen (m)", hint: "Fill in to see how much gas is stored." },
  {
    name: "burnerLitresPerHour",
    label: "Burner flow (L/h)",
    hint: `Leave empty for a typical household burner (${DEFAULT_BURNER_LITRES_PER_HOUR} L/h).`,
  },
];

/** Pressure under a floating drum, and the gas it holds (POST /api/calc/gas-holder). */
export function GasHolderCalculator() {
  const mutation = useGasHolderCalculation();
  return (
    <CalculatorForm
      label="Gas-holder pressure and stored gas"
      fields={fields}
      schema={GasHolderRequestSchema}
      mutation={mutation}
      submitLabel="Work out the pressure"
      renderResult={(result, request) => {
        const totalKg = request.drumMassKg + (request.addedMassKg ?? 0);
        const stored =
          result.storedLitres !== undefined && result.cookingMinutes !== undefined
            ? ` The ${formatNumber(result.storedLitres, 0)} L of gas under the risen drum give about ${formatNumber(result.cookingMinutes, 0)} minutes of cooking at ${formatNumber(request.burnerLitresPerHour ?? DEFAULT_BURNER_LITRES_PER_HOUR, 0)} L/h.`
            : "";
        return (
          <ResultPanel
            sentence={`${formatNumber(totalKg)} kg pressing on a drum ${formatNumber(request.drumDiameterM, 2)} m across puts the gas at about ${formatNumber(result.pressureMbar, 1)} mbar (${formatNumber(result.pressureMmWc, 0)} mm of water column).${stored}`}
            figures={[
              { label: "Pressure", value: formatNumber(result.pressureMbar, 2), unit: "mbar" },
              { label: "Pressure in water column", value: formatNumber(result.pressureMmWc, 0), unit: "mm" },
              { label: "Pressure in pascal", value: formatNumber(result.pressurePa, 0), unit: "Pa" },
              ...(result.storedLitres !== undefined
                ? [{ label: "Gas stored", value: formatNumber(result.storedLitres, 0), unit: "L" }]
                : []),
              ...(result.cookingMinutes !== undefined
                ? [{ label: "Cooking time", value: formatNumber(result.cookingMinutes, 0), unit: "min" }]
                : []),
            ]}
          />
        );
      }}
    />
  );
}
