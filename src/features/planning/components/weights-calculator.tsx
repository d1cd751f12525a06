import { WeightsForPressureRequestSchema } from "@shared/schemas/calc";
import { GAS_HOLDER_CAUTIONS } from "@shared/domain";
import { Alert } from "@/components/ui";
import { useWeightsForPressureCalculation } from "../api/calc-weights-for-pressure";
import { formatNumber } from "../utils/numbers";
import { CalculatorForm, type NumberFieldSpec } from "./calculator-form";
import { drumFields } from "./gas-holder-calculator";
import { ResultPanel } from "./result-panel";

const fields: NumberFieldSpec[] = [
  ...drumFields,
  {
    name: "targetPressurePa",
    label: "Pressure you want (Pa)",
    hint: "1 mbar = 100 Pa; 1 mm of water column ≈ 9.8 Pa. Ask the stove's supplier what it needs.",
    required: true,
  },
];

/** Weights to add on the drum for a target pressure (POST /api/calc/weights-for-pressure). */
export function WeightsCalculator() {
  const mutation = useWeightsForPressureCalculation();
  return (
    <CalculatorForm
      label="Weights for a steadier flame"
      fields={fields}
      schema={WeightsForPressureRequestSchema}
      mutation={mutation}
      submitLabel="Work out the weights"
      renderResult={(result, request) => {
        // Anything not among the standing cautions is about this answer (the drum alone is too heavy).
        const notes = result.cautions.filter((caution) => !GAS_HOLDER_CAUTIONS.includes(caution));
        return (
          <ResultPanel
            sentence={
              result.addedMassKg > 0
                ? `Add about ${formatNumber(result.addedMassKg)} kg, spread evenly on the drum, to hold the gas at ${formatNumber(request.targetPressurePa, 0)} Pa (${formatNumber(request.targetPressurePa / 100, 1)} mbar).`
                : `No weights are needed: the drum alone gives at least ${formatNumber(request.targetPressurePa, 0)} Pa.`
            }
            figures={[{ label: "Weights to add", value: formatNumber(result.addedMassKg), unit: "kg" }]}
          >
            {notes.map((note) => (
              <Alert key={note} variant="info" title="About this drum" announce="off">
                <p>{note}</p>
              </Alert>
            ))}
          </ResultPanel>
        );
      }}
    />
  );
}
