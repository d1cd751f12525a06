import { useId, useMemo, useState } from "react";
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createPaginatedRowModel,
  createSortedRowModel,
  filterFn_equalsString,
  filterFn_includesString,
  rowPaginationFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_text,
  tableFeatures,
  useTable,
} from "@tanstack/react-table";
import {
  DROP_OFF_STATUSES,
  DROP_OFF_STATUS_LABELS,
  TURNED_AWAY_REASON_LABELS,
  type DropOff,
} from "@shared/schemas/drop-offs";
import { Alert, Badge, Button, EmptyState, Field, Select, Table, TableCaption, TBody, TD, TR } from "@/components/ui";
import { ApiError } from "@/lib/api-client";
import { useCancelDropOff } from "../api/cancel-drop-off";
import { amountText, dayText, mixLabels, statusTones } from "../utils/labels";
import { SortableHead } from "@/components/data-table/sortable-head";
import { TablePager } from "@/components/data-table/table-pager";

const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  rowPaginationFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  paginatedRowModel: createPaginatedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, basic: sortFn_basic },
  filterFns: { includesString: filterFn_includesString, equalsString: filterFn_equalsString },
});

const helper = createColumnHelper<typeof features, DropOff>();
const PAGE_SIZE = 20;

/** The household's drop-offs and what became of each: sort by day, amount or status; filter by status and digester. */
export function DropOffHistoryTable({ dropOffs }: { dropOffs: DropOff[] }) {
  const id = useId();
  const cancel = useCancelDropOff();
  const [status, setStatus] = useState("");
  const [digester, setDigester] = useState("");
  const [notice, setNotice] = useState<{ ok: boolean; text: string } | null>(null);
  const digesterNames = useMemo(() => [...new Set(dropOffs.map((d) => d.digesterName))].sort(), [dropOffs]);

  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor("forDate", { header: "Day", sortFn: "alphanumeric", cell: (info) => dayText(info.getValue()) }),
        helper.accessor("status", {
          header: "What became of it",
          sortFn: "text",
          filterFn: "equalsString",
          cell: (info) => {
            const d = info.row.original;
            return (
              <span className="flex flex-col items-start gap-1">
                <Badge tone={statusTones[d.status]}>{DROP_OFF_STATUS_LABELS[d.status]}</Badge>
                {d.status === "turned_away" && d.turnedAwayReason ? (
                  <span className="text-base">{TURNED_AWAY_REASON_LABELS[d.turnedAwayReason]}</span>
                ) : null}
                {d.status === "fed" && d.fedOn ? (
                  <span className="text-base text-muted">on {dayText(d.fedOn)}</span>
                ) : null}
              </span>
            );
          },
        }),
        helper.accessor("digesterName", { header: "Digester", sortFn: "text", filterFn: "equalsString" }),
        helper.accessor("freshKg", {
          header: "Amount",
          sortFn: "basic",
          cell: (info) => amountText(info.row.original),
        }),
        helper.accessor("mix", {
          header: "What",
          enableSorting: false,
          cell: (info) => {
            const d = info.row.original;
            return `${mixLabels[d.mix]}${d.citrusPercent > 0 ? `, ${d.citrusPercent} % citrus` : ""}`;
          },
        }),
        helper.accessor("loggedBy", { header: "Logged by", sortFn: "text", cell: (info) => info.getValue() ?? "—" }),
        helper.display({
          id: "actions",
          header: () => <span className="sr-only">Actions</span>,
          cell: (info) => {
            const d = info.row.original;
            if (d.status !== "pending") return null;
            return (
              <Button
                type="button"
                variant="outline"
                size="sm"
                loading={cancel.isPending && cancel.variables === d.id}
                onClick={() =>
                  cancel.mutate(d.id, {
                    onSuccess: () =>
                      setNotice({ ok: true, text: `The drop-off of ${dayText(d.forDate)} is cancelled.` }),
                    onError: (err) =>
                      setNotice({
                        ok: false,
                        text: err instanceof ApiError ? err.message : "It could not be cancelled. Try again.",
                      }),
                  })
                }
              >
                Cancel
                <span className="sr-only">
                  {" "}
                  the drop-off of {dayText(d.forDate)}, {amountText(d)}
                </span>
              </Button>
            );
          },
        }),
      ]),
    [cancel],
  );

  const table = useTable({
    features,
    columns,
    data: dropOffs,
    initialState: { sorting: [{ id: "forDate", desc: true }], pagination: { pageIndex: 0, pageSize: PAGE_SIZE } },
  });

  const applyFilters = (next: { status?: string; digester?: string }) => {
    const s = next.status ?? status;
    const d = next.digester ?? digester;
    setStatus(s);
    setDigester(d);
    table.getColumn("status")?.setFilterValue(s || undefined);
    table.getColumn("digesterName")?.setFilterValue(d || undefined);
    table.setPageIndex(0);
  };

  if (dropOffs.length === 0) {
    return (
      <EmptyState
        title="No drop-offs yet"
        description="Your household's drop-offs will show here, with what became of each."
      />
    );
  }

  const rows = table.getRowModel().rows;
  const total = table.getFilteredRowModel().rows.length;
  const { pageIndex } = table.state.pagination;
  const first = total === 0 ? 0 : pageIndex * PAGE_SIZE + 1;
  const last = Math.min(total, (pageIndex + 1) * PAGE_SIZE);

  return (
    <div className="flex flex-col gap-4">
      {notice ? (
        <Alert
          variant={notice.ok ? "success" : "danger"}
          title={notice.text}
          announce={notice.ok ? "polite" : "assertive"}
        />
      ) : null}
      <div role="search" aria-label="Filter drop-offs" className="grid gap-4 sm:grid-cols-2">
        <Field label="What became of it">
          <Select
            value={status}
            onChange={(e) => applyFilters({ status: e.target.value })}
            placeholder="Any"
            options={DROP_OFF_STATUSES.map((s) => ({ value: s, label: DROP_OFF_STATUS_LABELS[s] }))}
          />
        </Field>
        <Field label="Digester">
          <Select
            value={digester}
            onChange={(e) => applyFilters({ digester: e.target.value })}
            placeholder="Any digester"
            options={digesterNames.map((n) => ({ value: n, label: n }))}
          />
        </Field>
      </div>
      <p id={`${id}-count`} role="status" className="text-base text-muted">
        {total === 0
          ? "No drop-offs match."
          : `Showing ${first}–${last} of ${total} ${total === 1 ? "drop-off" : "drop-offs"}.`}
      </p>
      {total === 0 ? (
        <EmptyState title="No drop-offs match these filters" description="Choose another status or digester." />
      ) : (
        <Table label="Your drop-offs" aria-describedby={`${id}-count`}>
          <TableCaption className="sr-only">Your household's drop-offs and what became of them</TableCaption>
          <SortableHead groups={table.getHeaderGroups()} render={(header) => <table.FlexRender header={header} />} />
          <TBody>
            {rows.map((row) => (
              <TR key={row.id}>
                {row.getAllCells().map((cell) => (
                  <TD key={cell.id} className="relative">
                    <table.FlexRender cell={cell} />
                  </TD>
                ))}
              </TR>
            ))}
          </TBody>
        </Table>
      )}
      <TablePager
        noun="drop-offs"
        pageIndex={pageIndex}
        pageCount={table.getPageCount()}
        canPrevious={table.getCanPreviousPage()}
        canNext={table.getCanNextPage()}
        onPrevious={() => table.previousPage()}
        onNext={() => table.nextPage()}
      />
    </div>
  );
}
