import { SizingFromScrapsRequestSchema } from "@shared/schemas/calc";
import { DEFAULT_SCRAPS_TS_PERCENT, minimumRetentionDays } from "@shared/domain";
import { useSizingFromScrapsCalculation } from "../api/calc-sizing";
import { formatNumber } from "../utils/numbers";
import { CalculatorForm, type NumberFieldSpec } from "./calculator-form";
import { ResultPanel } from "./result-panel";

const fields: NumberFieldSpec[] = [
  {
    name: "dailyScrapsKg",
    label: "Scraps a day (kg)",
    hint: "Weigh the buckets of a typical week and divide by 7.",
    required: true,
  },
  {
    name: "temperatureC",
    label: "Digester temperature in the cold season (°C)",
    hint: "Size for the coldest weeks. Below 10 °C digestion stops.",
    required: true,
  },
  {
    name: "scrapsTsPercent",
    label: "Dry matter of the scraps (% of fresh mass)",
    hint: `Leave empty for mixed household scraps (${DEFAULT_SCRAPS_TS_PERCENT} %).`,
  },
];

/** How big a digester a day's scraps need (POST /api/calc/sizing, daily-scraps shape). */
export function SizingCalculator() {
  const mutation = useSizingFromScrapsCalculation();
  return (
    <CalculatorForm
      label="Digester size"
      fields={fields}
      schema={SizingFromScrapsRequestSchema}
      mutation={mutation}
      submitLabel="Work out the size"
      renderResult={(result, request) => {
        const minimum = minimumRetentionDays(request.temperatureC);
        const organicSets = result.retentionDays > minimum + 0.05;
        return (
          <ResultPanel
            sentence={
              <>
                For {formatNumber(request.dailyScrapsKg)} kg of scraps a day at {formatNumber(request.temperatureC)} °C,
                plan a working volume of about {formatNumber(result.workingVolumeM3, 2)} m³: with{" "}
                {formatNumber(result.dilutionWaterLitresPerDay)} L of water the scraps make{" "}
                {formatNumber(result.dailySlurryLitres)} L of slurry a day, which stays about{" "}
                {formatNumber(result.retentionDays, 0)} days inside.
              </>
            }
            figures={[
              { label: "Working volume", value: formatNumber(result.workingVolumeM3, 2), unit: "m³" },
              { label: "Slurry a day", value: formatNumber(result.dailySlurryLitres), unit: "L" },
              { label: "Water to add a day", value: formatNumber(result.dilutionWaterLitresPerDay), unit: "L" },
              { label: "Retention time", value: formatNumber(result.retentionDays, 0), unit: "days" },
            ]}
          >
            <p>
              {organicSets
                ? "Here the organic load sets the size: a smaller tank would have to turn away part of the scraps on cold days."
                : `Here the minimum retention time sets the size (${minimum} days at this temperature).`}{" "}
              The working volume is the liquid only: the tank itself must be larger, with room for gas.
            </p>
          </ResultPanel>
        );
      }}
    />
  );
}
