import type { ReactNode } from "react";
import { Bar, CartesianGrid, ComposedChart, Line, LineChart, ReferenceLine, Tooltip, XAxis, YAxis } from "recharts";
import { PH_HALVE_BELOW, PH_STOP_BELOW } from "@shared/domain";
import type { DigesterHistory } from "@shared/schemas/digester";
import { Table, TableCaption, TBody, TD, TH, THead, TR } from "@/components/ui";
import { formatNumber, shortDay } from "../utils/format";

// Series differ by dash and marker as well as colour; their keys sit above each chart.
const DASH_LIMIT = "8 4";
const DASH_RANGE = "2 3";

function Key({ colour, dash, bar, children }: { colour: string; dash?: string; bar?: boolean; children: string }) {
  return (
    <span className="inline-flex items-center gap-2">
      <svg aria-hidden="true" width="36" height="12" className="shrink-0">
        {bar ? (
          <rect x="8" y="0" width="20" height="12" fill={colour} />
        ) : (
          <line x1="0" y1="6" x2="36" y2="6" stroke={colour} strokeWidth="3" strokeDasharray={dash} />
        )}
      </svg>
      {children}
    </span>
  );
}

const axis = { tick: { fill: "var(--hl-muted)" }, stroke: "var(--hl-border)" } as const;
const tooltipStyle = {
  background: "var(--hl-surface)",
  borderColor: "var(--hl-border)",
  color: "var(--hl-foreground)",
};

function ChartFigure({
  title,
  description,
  keys,
  children,
}: {
  title: string;
  description: string;
  keys: ReactNode;
  children: ReactNode;
}) {
  return (
    <figure className="flex flex-col gap-2 rounded-lg border border-border bg-surface p-4">
      <figcaption className="flex flex-col gap-1">
        <span className="text-lg font-bold">{title}</span>
        <span className="text-base text-muted">{description}</span>
        <span className="flex flex-wrap gap-4 text-base">{keys}</span>
      </figcaption>
      {/* The table below carries the same figures for screen readers and keyboard users. */}
      <div aria-hidden="true" className="w-full">
        {children}
      </div>
    </figure>
  );
}

/** Four 60-day charts — load against the limit, temperature, pH, expected gas — and the same figures as a table. */
export function HistoryCharts({ history }: { history: DigesterHistory }) {
  const data = history.days.map((d) => ({ ...d, label: shortDay(d.date) }));
  const common = {
    data,
    margin: { top: 8, right: 16, bottom: 8, left: 8 },
    style: { width: "100%", height: 240 },
    responsive: true,
    accessibilityLayer: false,
  } as const;
  return (
    <div className="flex flex-col gap-4">
      <div className="grid gap-4 lg:grid-cols-2">
        <ChartFigure
          title="Daily load against the limit (kg VS)"
          description="Bars: what was fed each day. Dashed: the organic-load limit at that day's temperature. Dotted: the budget a steward's accept recorded."
          keys={
            <>
              <Key colour="var(--hl-primary)" bar>
                Fed
              </Key>
              <Key colour="var(--hl-warning)" dash={DASH_LIMIT}>
                Organic-load limit
              </Key>
              <Key colour="var(--hl-accent)" dash={DASH_RANGE}>
                Recorded budget
              </Key>
            </>
          }
        >
          <ComposedChart {...common}>
            <CartesianGrid stroke="var(--hl-border)" strokeOpacity={0.4} />
            <XAxis dataKey="label" {...axis} minTickGap={16} />
            <YAxis {...axis} width={48} />
            <Tooltip contentStyle={tooltipStyle} formatter={(v) => `${formatNumber(Number(v), 2)} kg VS`} />
            <Bar dataKey="loadKgVs" name="Fed" fill="var(--hl-primary)" isAnimationActive={false} />
            <Line
              dataKey="organicLimitKgVs"
              name="Organic-load limit"
              stroke="var(--hl-warning)"
              strokeWidth={2}
              strokeDasharray={DASH_LIMIT}
              dot={false}
              connectNulls
              isAnimationActive={false}
            />
            <Line
              dataKey="recordedCapKgVs"
              name="Recorded budget"
              stroke="var(--hl-accent)"
              strokeWidth={3}
              strokeDasharray={DASH_RANGE}
              dot={{ r: 3 }}
              isAnimationActive={false}
            />
          </ComposedChart>
        </ChartFigure>
        <ChartFigure
          title="Digester temperature (°C)"
          description="Solid: the day's mean. Dotted: the day's lowest and highest."
          keys={
            <>
              <Key colour="var(--hl-primary)">Mean</Key>
              <Key colour="var(--hl-info)" dash={DASH_RANGE}>
                Lowest and highest
              </Key>
            </>
          }
        >
          <LineChart {...common}>
            <CartesianGrid stroke="var(--hl-border)" strokeOpacity={0.4} />
            <XAxis dataKey="label" {...axis} minTickGap={16} />
            <YAxis {...axis} width={48} domain={["auto", "auto"]} />
            <Tooltip contentStyle={tooltipStyle} formatter={(v) => `${formatNumber(Number(v))} °C`} />
            <Line
              dataKey="temperatureMinC"
              name="Lowest"
              stroke="var(--hl-info)"
              strokeDasharray={DASH_RANGE}
              dot={false}
              isAnimationActive={false}
            />
            <Line
              dataKey="temperatureMaxC"
              name="Highest"
              stroke="var(--hl-info)"
              strokeDasharray={DASH_RANGE}
              dot={false}
              isAnimationActive={false}
            />
            <Line
              dataKey="temperatureMeanC"
              name="Mean"
              stroke="var(--hl-primary)"
              strokeWidth={3}
              dot={{ r: 2 }}
              isAnimationActive={false}
            />
          </LineChart>
        </ChartFigure>
        <ChartFigure
          title="pH"
          description={`The day's last pH. Below ${PH_HALVE_BELOW}: feed half; below ${PH_STOP_BELOW}: stop feeding.`}
          keys={
            <>
              <Key colour="var(--hl-primary)">pH</Key>
              <Key colour="var(--hl-warning)" dash={DASH_LIMIT}>
                {`Halve below ${PH_HALVE_BELOW}`}
              </Key>
              <Key colour="var(--hl-danger)" dash={DASH_RANGE}>
                {`Stop below ${PH_STOP_BELOW}`}
              </Key>
            </>
          }
        >
          <LineChart {...common}>
            <CartesianGrid stroke="var(--hl-border)" strokeOpacity={0.4} />
            <XAxis dataKey="label" {...axis} minTickGap={16} />
            <YAxis {...axis} width={48} domain={[6, 8]} />
            <Tooltip contentStyle={tooltipStyle} formatter={(v) => formatNumber(Number(v), 2)} />
            <ReferenceLine y={PH_STOP_BELOW} stroke="var(--hl-danger)" strokeWidth={2} strokeDasharray={DASH_RANGE} />
            <ReferenceLine y={PH_HALVE_BELOW} stroke="var(--hl-warning)" strokeWidth={2} strokeDasharray={DASH_LIMIT} />
            <Line
              dataKey="ph"
              name="pH"
              stroke="var(--hl-primary)"
              strokeWidth={3}
              dot={{ r: 3 }}
              connectNulls
              isAnimationActive={false}
            />
          </LineChart>
        </ChartFigure>
        <ChartFigure
          title="Expected biogas (litres a day, estimate)"
          description="From the mean load of the 14 days before and the day's temperature (Chen–Hashimoto model). An estimate, not a measurement."
          keys={<Key colour="var(--hl-primary)">Expected biogas</Key>}
        >
          <LineChart {...common}>
            <CartesianGrid stroke="var(--hl-border)" strokeOpacity={0.4} />
            <XAxis dataKey="label" {...axis} minTickGap={16} />
            <YAxis {...axis} width={56} />
            <Tooltip contentStyle={tooltipStyle} formatter={(v) => `${formatNumber(Number(v), 0)} L`} />
            <Line
              dataKey="expectedBiogasLitres"
              name="Expected biogas"
              stroke="var(--hl-primary)"
              strokeWidth={3}
              dot={false}
              connectNulls
              isAnimationActive={false}
            />
          </LineChart>
        </ChartFigure>
      </div>
      <details className="rounded-lg border border-border bg-surface p-4">
        <summary className="min-h-11 cursor-pointer py-2 font-bold">The same figures as a table</summary>
        <Table label="Daily figures" containerClassName="mt-2">
          <TableCaption>
            Day by day, {shortDay(history.from)} to {shortDay(history.to)}
          </TableCaption>
          <THead>
            <TR>
              <TH>Day</TH>
              <TH>Fed (kg VS)</TH>
              <TH>Fed (kg scraps)</TH>
              <TH>Organic-load limit (kg VS)</TH>
              <TH>Recorded budget (kg VS)</TH>
              <TH>Temperature, mean (lowest–highest) °C</TH>
              <TH>pH</TH>
              <TH>Expected biogas (L)</TH>
            </TR>
          </THead>
          <TBody>
            {[...history.days].reverse().map((d) => (
              <TR key={d.date}>
                <TH scope="row">{shortDay(d.date)}</TH>
                <TD>{formatNumber(d.loadKgVs, 2)}</TD>
                <TD>{formatNumber(d.loadKgScraps)}</TD>
                <TD>{formatNumber(d.organicLimitKgVs, 2)}</TD>
                <TD>{formatNumber(d.recordedCapKgVs, 2)}</TD>
                <TD>
                  {d.temperatureMeanC === null
                    ? "—"
                    : `${formatNumber(d.temperatureMeanC)} (${formatNumber(d.temperatureMinC)}–${formatNumber(d.temperatureMaxC)})`}
                </TD>
                <TD>{formatNumber(d.ph, 2)}</TD>
                <TD>{formatNumber(d.expectedBiogasLitres, 0)}</TD>
              </TR>
            ))}
          </TBody>
        </Table>
      </details>
    </div>
  );
}
