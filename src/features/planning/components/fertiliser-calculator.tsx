import { FertiliserAllowanceRequestSchema } from "@shared/schemas/calc";
import { DEFAULT_N_LIMIT_KG_PER_HA_YEAR, REFERENCE_DIGESTATE_N_G_PER_L } from "@shared/domain";
import { useFertiliserAllowanceCalculation } from "../api/calc-fertiliser-allowance";
import { formatNumber } from "../utils/numbers";
import { CalculatorForm, type NumberFieldSpec } from "./calculator-form";
import { ResultPanel } from "./result-panel";

const fields: NumberFieldSpec[] = [
  { name: "bedAreaM2", label: "Bed area (m²)", hint: "Length times width of the bed, in metres.", required: true },
  {
    name: "nitrogenGPerL",
    label: "Digestate nitrogen (g N/L)",
    hint: `Unmeasured? ${REFERENCE_DIGESTATE_N_G_PER_L} g N/L is typical of food-based digestate.`,
    required: true,
    defaultValue: String(REFERENCE_DIGESTATE_N_G_PER_L),
  },
  {
    name: "limitKgNPerHaYear",
    label: "Nitrogen limit (kg N per hectare a year)",
    hint: `Leave empty for the ${DEFAULT_N_LIMIT_KG_PER_HA_YEAR} kg reference limit; local rules may differ.`,
  },
];

/** Yearly litres of digestate a bed may take (POST /api/calc/fertiliser-allowance). */
export function FertiliserCalculator() {
  const mutation = useFertiliserAllowanceCalculation();
  return (
    <CalculatorForm
      label="Fertiliser for a bed"
      fields={fields}
      schema={FertiliserAllowanceRequestSchema}
      mutation={mutation}
      submitLabel="Work out the litres"
      renderResult={(result, request) => (
        <ResultPanel
          sentence={`A ${formatNumber(request.bedAreaM2)} m² bed may take about ${formatNumber(result.litresPerYear, 0)} L of undiluted digestate a year at ${formatNumber(request.nitrogenGPerL)} g N/L, spread over the growing season.`}
          figures={[
            { label: "Digestate a year", value: formatNumber(result.litresPerYear, 0), unit: "L" },
            {
              label: "Per square metre",
              value: formatNumber(result.litresPerYear / request.bedAreaM2, 1),
              unit: "L/m²",
            },
          ]}
        >
          <p>{result.dilution}</p>
        </ResultPanel>
      )}
    />
  );
}
