import { useMemo } from "react";
import type { CsvColumn } from "@shared/csv";
import { SCRAP_CATEGORY_PROFILES } from "@shared/domain";
import type { Feeding } from "@shared/schemas/feedings";
import { formatNumber, shortDay } from "../utils/format";
import { recordColumnHelper, RecordsTable } from "./records-table";

type FeedingRow = Feeding & { origin: "hand" | "drop-off" };
const helper = recordColumnHelper<FeedingRow>();

const csvColumns: CsvColumn<FeedingRow>[] = [
  { header: "fed_on", value: (f) => f.fedOn },
  { header: "fed_at", value: (f) => f.fedAt },
  { header: "fresh_kg", value: (f) => f.freshKg },
  { header: "kg_vs", value: (f) => f.kgVs },
  { header: "water_litres", value: (f) => f.waterLitres },
  { header: "mix", value: (f) => f.mix },
  { header: "household", value: (f) => f.householdName },
  { header: "override_reason", value: (f) => f.overrideReason },
  { header: "entered_by", value: (f) => f.enteredBy },
  { header: "note", value: (f) => f.note },
];

/** The digester's feedings of the last 60 days: sort, search, filter by origin, export. */
export function FeedingsTable({ digesterId, feedings }: { digesterId: number; feedings: Feeding[] }) {
  const rows = useMemo(
    () => feedings.map((f): FeedingRow => ({ ...f, origin: f.dropOffId === null ? "hand" : "drop-off" })),
    [feedings],
  );
  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor("fedOn", {
          header: "Day",
          sortFn: "text",
          cell: (i) => <span className="whitespace-nowrap">{shortDay(i.getValue())}</span>,
        }),
        helper.accessor("freshKg", { header: "Scraps (kg)", sortFn: "basic", cell: (i) => formatNumber(i.getValue()) }),
        helper.accessor("kgVs", { header: "kg VS", sortFn: "basic", cell: (i) => formatNumber(i.getValue(), 2) }),
        helper.accessor("waterLitres", {
          header: "Water (L)",
          sortFn: "basic",
          cell: (i) => formatNumber(i.getValue()),
        }),
        helper.accessor("mix", {
          header: "Mix",
          sortFn: "text",
          cell: (i) => (i.getValue() ? SCRAP_CATEGORY_PROFILES[i.getValue()!].label : "—"),
        }),
        helper.accessor("origin", {
          header: "From",
          sortFn: "text",
          filterFn: "equalsString",
          cell: (i) => i.row.original.householdName ?? (i.getValue() === "hand" ? "Added by hand" : "A drop-off"),
        }),
        helper.accessor("overrideReason", {
          header: "Beyond budget because",
          enableSorting: false,
          cell: (i) => i.getValue() ?? "",
        }),
        helper.accessor("enteredBy", { header: "By", sortFn: "text", cell: (i) => i.getValue() ?? "—" }),
        helper.accessor("note", { header: "Note", enableSorting: false, cell: (i) => i.getValue() ?? "" }),
      ]),
    [],
  );
  return (
    <RecordsTable
      noun="feedings"
      caption="Feedings of the last 60 days"
      data={rows}
      columns={columns}
      initialSort={{ id: "fedOn", desc: true }}
      searchColumns={["note", "enteredBy", "overrideReason"]}
      searchLabel="Search notes, names and reasons"
      filter={{
        columnId: "origin",
        label: "From",
        anyLabel: "Drop-offs and by hand",
        options: [
          { value: "drop-off", label: "From drop-offs" },
          { value: "hand", label: "Added by hand" },
        ],
      }}
      csv={{ columns: csvColumns, fileName: `digester-${digesterId}-feedings-shown.csv` }}
      serverCsvHref={`/api/digesters/${digesterId}/feedings.csv`}
    />
  );
}
