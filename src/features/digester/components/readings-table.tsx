import { useMemo } from "react";
import type { CsvColumn } from "@shared/csv";
import type { Reading } from "@shared/schemas/readings";
import { formatNumber, shortDateTime } from "../utils/format";
import { recordColumnHelper, RecordsTable } from "./records-table";

const helper = recordColumnHelper<Reading>();
const sourceWords: Record<Reading["source"], string> = { manual: "Logged by hand", upload: "Sensor upload" };

const csvColumns: CsvColumn<Reading>[] = [
  { header: "taken_at", value: (r) => r.takenAt },
  { header: "temperature_c", value: (r) => r.temperatureC },
  { header: "ph", value: (r) => r.ph },
  { header: "vfa_ta_ratio", value: (r) => r.vfaTaRatio },
  { header: "gas_level_percent", value: (r) => r.gasLevelPercent },
  { header: "drum_rise_m", value: (r) => r.drumRiseM },
  { header: "gas_used_minutes", value: (r) => r.gasUsedMinutes },
  { header: "source", value: (r) => r.source },
  { header: "entered_by", value: (r) => r.enteredBy },
  { header: "note", value: (r) => r.note },
];

/** The digester's readings of the last 60 days: sort, search notes and names, filter by source, export. */
export function ReadingsTable({ digesterId, readings }: { digesterId: number; readings: Reading[] }) {
  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor("takenAt", {
          header: "Taken",
          sortFn: "datetime",
          cell: (i) => <span className="whitespace-nowrap">{shortDateTime(i.getValue())}</span>,
        }),
        helper.accessor("temperatureC", {
          header: "Temperature (°C)",
          sortFn: "basic",
          sortUndefined: "last",
          cell: (i) => formatNumber(i.getValue()),
        }),
        helper.accessor("ph", { header: "pH", sortFn: "basic", cell: (i) => formatNumber(i.getValue(), 2) }),
        helper.accessor("vfaTaRatio", {
          header: "FOS/TAC",
          sortFn: "basic",
          cell: (i) => formatNumber(i.getValue(), 2),
        }),
        helper.accessor("gasLevelPercent", {
          header: "Gas level (%)",
          sortFn: "basic",
          cell: (i) => formatNumber(i.getValue(), 0),
        }),
        helper.accessor("gasUsedMinutes", {
          header: "Gas used (min)",
          sortFn: "basic",
          cell: (i) => formatNumber(i.getValue(), 0),
        }),
        helper.accessor("source", {
          header: "Source",
          sortFn: "text",
          filterFn: "equalsString",
          cell: (i) => sourceWords[i.getValue()],
        }),
        helper.accessor("enteredBy", { header: "By", sortFn: "text", cell: (i) => i.getValue() ?? "—" }),
        helper.accessor("note", { header: "Note", enableSorting: false, cell: (i) => i.getValue() ?? "" }),
      ]),
    [],
  );
  return (
    <RecordsTable
      noun="readings"
      caption="Readings of the last 60 days"
      data={readings}
      columns={columns}
      initialSort={{ id: "takenAt", desc: true }}
      searchColumns={["note", "enteredBy"]}
      searchLabel="Search notes and names"
      filter={{
        columnId: "source",
        label: "Source",
        anyLabel: "Any source",
        options: (Object.keys(sourceWords) as Reading["source"][]).map((s) => ({ value: s, label: sourceWords[s] })),
      }}
      csv={{ columns: csvColumns, fileName: `digester-${digesterId}-readings-shown.csv` }}
      serverCsvHref={`/api/digesters/${digesterId}/readings.csv`}
    />
  );
}
