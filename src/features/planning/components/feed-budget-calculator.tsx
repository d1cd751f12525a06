import { FeedBudgetRequestSchema } from "@shared/schemas/calc";
import { DEFAULT_BUCKET_LITRES } from "@shared/domain";
import { Alert, type AlertVariant } from "@/components/ui";
import { useFeedBudgetCalculation } from "../api/calc-feed-budget";
import { formatNumber } from "../utils/numbers";
import { CalculatorForm, type NumberFieldSpec } from "./calculator-form";
import { ResultPanel } from "./result-panel";

const fields: NumberFieldSpec[] = [
  { name: "workingVolumeM3", label: "Working volume (m³)", hint: "The liquid part of the tank.", required: true },
  {
    name: "temperatureC",
    label: "Digester temperature today (°C)",
    hint: "Leave empty to see what happens without a reading.",
  },
  { name: "ph", label: "pH this week", hint: "Leave empty if it was not measured." },
  { name: "bucketLitres", label: "Bucket size (L)", hint: `Leave empty for ${DEFAULT_BUCKET_LITRES} L buckets.` },
];

const severityVariant: Record<string, AlertVariant> = { stop: "danger", caution: "warning", info: "info" };

/** A day's feed budget for a digester with no feeding history (POST /api/calc/feed-budget). */
export function FeedBudgetCalculator() {
  const mutation = useFeedBudgetCalculation();
  return (
    <CalculatorForm
      label="Feed budget try-out"
      fields={fields}
      schema={FeedBudgetRequestSchema}
      mutation={mutation}
      submitLabel="Work out today's budget"
      // No reading is a real answer here ("log a temperature"), not a mistake in the form.
      prepare={(body) => ({ ...body, temperatureC: body.temperatureC ?? null })}
      renderResult={(result, request) => (
        <ResultPanel
          sentence={result.explanation}
          figures={[
            { label: "Scraps still welcome", value: formatNumber(result.budgetKgScraps), unit: "kg" },
            {
              label: "Buckets",
              value: formatNumber(result.budgetBuckets),
              unit: `of ${formatNumber(request.bucketLitres ?? DEFAULT_BUCKET_LITRES)} L`,
            },
            { label: "Volatile solids", value: formatNumber(result.budgetKgVs, 2), unit: "kg VS" },
          ]}
        >
          {result.warnings.map((warning) => (
            <Alert
              key={warning.code}
              variant={severityVariant[warning.severity] ?? "info"}
              title={warning.message}
              announce="off"
            >
              {warning.actions.length > 0 ? (
                <ul className="list-disc pl-6">
                  {warning.actions.map((action) => (
                    <li key={action}>{action}</li>
                  ))}
                </ul>
              ) : null}
            </Alert>
          ))}
        </ResultPanel>
      )}
    />
  );
}
