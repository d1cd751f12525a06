import { useEffect, useId } from "react";
import { useMutation } from "@tanstack/react-query";
import { CartesianGrid, Line, LineChart, ReferenceLine, Tooltip, XAxis, YAxis } from "recharts";
import { Table, TableCaption, TBody, TD, TH, THead, TR } from "@/components/ui";
import { planningKeys } from "../api/keys";
import { formatNumber } from "../utils/numbers";
import { planSeasonGas, SeasonGasFormSchema, type SeasonGasForm, type SeasonGasPoint } from "../utils/season-gas";
import { CalculatorForm, type NumberFieldSpec } from "./calculator-form";
import { ResultPanel } from "./result-panel";

const example: SeasonGasForm = {
  workingVolumeM3: 2,
  dailyScrapsKg: 8,
  burnerLitresPerHour: 350,
  coldTemperatureC: 15,
  warmTemperatureC: 30,
};

const fields: NumberFieldSpec[] = [
  { name: "workingVolumeM3", label: "Working volume (m³)", required: true },
  { name: "dailyScrapsKg", label: "Scraps a day (kg)", required: true },
  { name: "coldTemperatureC", label: "Cold-season digester temperature (°C)", required: true },
  { name: "warmTemperatureC", label: "Warm-season digester temperature (°C)", required: true },
  {
    name: "burnerLitresPerHour",
    label: "Burner flow (L/h)",
    hint: "A typical household burner uses 350 L/h.",
    required: true,
  },
].map((field) => ({ ...field, defaultValue: String(example[field.name as keyof SeasonGasForm]) }));

function seasonSentence(season: string, point: SeasonGasPoint, plannedKg: number) {
  const fed = point.limitedByBudget
    ? `the digester can take only ${formatNumber(point.fedKgScraps)} of the ${formatNumber(plannedKg)} kg a day`
    : `it takes all ${formatNumber(plannedKg)} kg a day`;
  if (point.biogasLitresPerDay <= 0) {
    return `In the ${season} (${formatNumber(point.temperatureC)} °C) it is too cold to digest: no gas and no feeding.`;
  }
  return `In the ${season} (${formatNumber(point.temperatureC)} °C) ${fed} and makes about ${formatNumber(point.biogasLitresPerDay, 0)} L of biogas, about ${formatNumber(point.cookingMinutesPerDay, 0)} minutes of cooking a day.`;
}

// The season lines differ by dash as well as colour; their key sits above the chart, where labels cannot collide.
const coldDash = "3 3";
const warmDash = "10 5";

function LineKey({ colour, dash, children }: { colour: string; dash: string; children: string }) {
  return (
    <span className="inline-flex items-center gap-2">
      <svg aria-hidden="true" width="36" height="8" className="shrink-0">
        <line x1="0" y1="4" x2="36" y2="4" stroke={colour} strokeWidth="2" strokeDasharray={dash} />
      </svg>
      {children}
    </span>
  );
}

/** The chart; the table beside it carries the same figures for screen readers and keyboard users. */
function SeasonGasChart({ plan, form }: { plan: ReturnType<typeof planSeasonGas>; form: SeasonGasForm }) {
  // Round degrees every 5 °C read better than the evenly split ticks recharts picks.
  const ticks = plan.curve.map((point) => point.temperatureC).filter((temperatureC) => temperatureC % 5 === 0);
  return (
    <div aria-hidden="true" className="w-full">
      <LineChart
        responsive
        accessibilityLayer={false}
        data={plan.curve}
        margin={{ top: 8, right: 16, bottom: 32, left: 8 }}
        style={{ width: "100%", height: 320 }}
      >
        <CartesianGrid stroke="var(--hl-border)" strokeOpacity={0.4} />
        <XAxis
          dataKey="temperatureC"
          type="number"
          domain={["dataMin", "dataMax"]}
          ticks={ticks}
          tick={{ fill: "var(--hl-muted)" }}
          stroke="var(--hl-border)"
          label={{ value: "Digester temperature (°C)", position: "bottom", offset: 8, fill: "var(--hl-foreground)" }}
        />
        <YAxis
          tick={{ fill: "var(--hl-muted)" }}
          stroke="var(--hl-border)"
          width={64}
          label={{
            value: "Biogas (L/day)",
            angle: -90,
            position: "insideLeft",
            offset: 0,
            fill: "var(--hl-foreground)",
          }}
        />
        <Tooltip
          formatter={(value) => [`${formatNumber(Number(value), 0)} L/day`, "Biogas"]}
          labelFormatter={(label) => `${String(label)} °C`}
          contentStyle={{
            background: "var(--hl-surface)",
            borderColor: "var(--hl-border)",
            color: "var(--hl-foreground)",
          }}
        />
        <ReferenceLine x={form.coldTemperatureC} stroke="var(--hl-info)" strokeWidth={2} strokeDasharray={coldDash} />
        <ReferenceLine
          x={form.warmTemperatureC}
          stroke="var(--hl-warning)"
          strokeWidth={2}
          strokeDasharray={warmDash}
        />
        <Line
          type="linear"
          dataKey="biogasLitresPerDay"
          stroke="var(--hl-primary)"
          strokeWidth={3}
          dot={false}
          isAnimationActive={false}
        />
      </LineChart>
    </div>
  );
}

/**
 * Expected gas and cooking time by season, worked out in the browser (shared domain: feed-budget
 * limits, Chen–Hashimoto, burner flow). Starts with an example digester so the chart is there at once.
 */
export function SeasonGasPlanner() {
  const captionId = useId();
  const mutation = useMutation({
    mutationKey: planningKeys.calc("season-gas"),
    mutationFn: async (form: SeasonGasForm) => planSeasonGas(form),
  });
  const { mutate } = mutation;

  useEffect(() => {
    mutate(example);
  }, [mutate]);

  return (
    <CalculatorForm
      label="Expected gas by season"
      fields={fields}
      schema={SeasonGasFormSchema}
      mutation={mutation}
      submitLabel="Show the expected gas"
      renderResult={(plan, form) => (
        <ResultPanel
          sentence={
            <>
              {seasonSentence("cold season", plan.cold, form.dailyScrapsKg)}{" "}
              {seasonSentence("warm season", plan.warm, form.dailyScrapsKg)}
            </>
          }
          figures={[
            { label: "Biogas, cold season", value: formatNumber(plan.cold.biogasLitresPerDay, 0), unit: "L/day" },
            { label: "Cooking, cold season", value: formatNumber(plan.cold.cookingMinutesPerDay, 0), unit: "min/day" },
            { label: "Biogas, warm season", value: formatNumber(plan.warm.biogasLitresPerDay, 0), unit: "L/day" },
            { label: "Cooking, warm season", value: formatNumber(plan.warm.cookingMinutesPerDay, 0), unit: "min/day" },
          ]}
        >
          <figure aria-labelledby={captionId} className="flex flex-col gap-2 rounded-lg bg-surface p-2">
            <figcaption id={captionId} className="px-2 font-bold">
              Expected biogas a day against digester temperature, for {formatNumber(form.workingVolumeM3, 2)} m³ and up
              to {formatNumber(form.dailyScrapsKg)} kg of scraps a day. The same figures are in the table below.
            </figcaption>
            <p className="flex flex-wrap gap-x-6 gap-y-1 px-2 text-base">
              <LineKey colour="var(--hl-info)" dash={coldDash}>
                {`Cold season, ${formatNumber(form.coldTemperatureC)} °C`}
              </LineKey>
              <LineKey colour="var(--hl-warning)" dash={warmDash}>
                {`Warm season, ${formatNumber(form.warmTemperatureC)} °C`}
              </LineKey>
            </p>
            <SeasonGasChart plan={plan} form={form} />
          </figure>
          <Table label="Expected gas by digester temperature">
            <TableCaption>Expected gas by digester temperature</TableCaption>
            <THead>
              <TR>
                <TH className="whitespace-normal">Digester temperature (°C)</TH>
                <TH className="whitespace-normal">Scraps it can take (kg/day)</TH>
                <TH className="whitespace-normal">Biogas (L/day)</TH>
                <TH className="whitespace-normal">Cooking (min/day)</TH>
              </TR>
            </THead>
            <TBody>
              {plan.tableRows.map((row) => (
                <TR key={row.temperatureC}>
                  <TH scope="row">
                    {formatNumber(row.temperatureC)}
                    {row.temperatureC === form.coldTemperatureC ? " (cold season)" : ""}
                    {row.temperatureC === form.warmTemperatureC ? " (warm season)" : ""}
                  </TH>
                  <TD className="tabular-nums">{formatNumber(row.fedKgScraps)}</TD>
                  <TD className="tabular-nums">{formatNumber(row.biogasLitresPerDay, 0)}</TD>
                  <TD className="tabular-nums">{formatNumber(row.cookingMinutesPerDay, 0)}</TD>
                </TR>
              ))}
            </TBody>
          </Table>
        </ResultPanel>
      )}
    />
  );
}
