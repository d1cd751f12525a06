import { TitrationRequestSchema } from "@shared/schemas/calc";
import { NORDMANN_ACID_NORMALITY, NORDMANN_SAMPLE_ML, ratioBand } from "@shared/domain";
import { Alert, type AlertVariant } from "@/components/ui";
import { useTitrationCalculation } from "../api/calc-titration";
import { formatNumber } from "../utils/numbers";
import { CalculatorForm, type NumberFieldSpec } from "./calculator-form";
import { ResultPanel } from "./result-panel";

const fields: NumberFieldSpec[] = [
  { name: "aMl", label: "Acid A (mL)", hint: "Used from the start down to pH 5.0.", required: true },
  { name: "bMl", label: "Acid B (mL)", hint: "Used further, from pH 5.0 down to 4.4.", required: true },
  { name: "sampleMl", label: "Sample (mL)", hint: `Leave empty for ${NORDMANN_SAMPLE_ML} mL.` },
  {
    name: "acidNormality",
    label: "Acid strength (N)",
    hint: `Leave empty for ${NORDMANN_ACID_NORMALITY} N sulphuric acid.`,
  },
];

const bandAlert: Record<ReturnType<typeof ratioBand>, { variant: AlertVariant; title: string }> = {
  stop: { variant: "danger", title: "Stop feeding" },
  halve: { variant: "warning", title: "Feed half" },
  hold: { variant: "warning", title: "Do not increase" },
  ok: { variant: "success", title: "Acids in hand" },
};

/** Acids-to-alkalinity (FOS/TAC) from a Nordmann titration (POST /api/calc/titration). */
export function TitrationCalculator() {
  const mutation = useTitrationCalculation();
  return (
    <CalculatorForm
      label="Acid check"
      fields={fields}
      schema={TitrationRequestSchema}
      mutation={mutation}
      submitLabel="Work out the ratio"
      renderResult={(result) => {
        const band = bandAlert[ratioBand(result.ratio)];
        return (
          <ResultPanel
            sentence={`The acids-to-alkalinity ratio is ${formatNumber(result.ratio, 2)}: ${formatNumber(result.fosMgPerL, 0)} mg/L of volatile acids against ${formatNumber(result.tacMgPerL, 0)} mg/L of buffer.`}
            figures={[
              { label: "Ratio (FOS/TAC)", value: formatNumber(result.ratio, 2) },
              { label: "Volatile acids (FOS)", value: formatNumber(result.fosMgPerL, 0), unit: "mg/L" },
              { label: "Buffer (TAC)", value: formatNumber(result.tacMgPerL, 0), unit: "mg/L CaCO₃" },
            ]}
          >
            <Alert variant={band.variant} title={band.title} announce="off">
              <p>{result.advice}</p>
            </Alert>
          </ResultPanel>
        );
      }}
    />
  );
}
