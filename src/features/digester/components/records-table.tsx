import { useId, useState } from "react";
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createPaginatedRowModel,
  createSortedRowModel,
  filterFn_equalsString,
  filterFn_includesString,
  globalFilteringFeature,
  rowPaginationFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_datetime,
  sortFn_text,
  tableFeatures,
  useTable,
  type ColumnDef,
  type RowData,
} from "@tanstack/react-table";
import { Download } from "lucide-react";
import { toCsv, type CsvColumn } from "@shared/csv";
import {
  Button,
  EmptyState,
  Field,
  Input,
  Select,
  Table,
  TableCaption,
  TBody,
  TD,
  TR,
  type SelectOption,
} from "@/components/ui";
import { downloadText } from "../utils/format";
import { SortableHead } from "@/components/data-table/sortable-head";
import { TablePager } from "@/components/data-table/table-pager";

export const recordFeatures = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  rowPaginationFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  paginatedRowModel: createPaginatedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, datetime: sortFn_datetime, basic: sortFn_basic },
  filterFns: { includesString: filterFn_includesString, equalsString: filterFn_equalsString },
});

/** Column helper for tables built on {@link RecordsTable}. */
export function recordColumnHelper<T extends RowData>() {
  return createColumnHelper<typeof recordFeatures, T>();
}

const PAGE_SIZE = 20;

export type RecordsTableProps<T extends RowData> = {
  /** Plural noun for counts and labels, e.g. "readings". */
  noun: string;
  caption: string;
  data: T[];
  columns: ColumnDef<typeof recordFeatures, T, any>[]; // eslint-disable-line @typescript-eslint/no-explicit-any -- column value types differ per column
  /** Column id and direction to start with. */
  initialSort: { id: string; desc: boolean };
  /** Columns the search box looks in. */
  searchColumns: string[];
  searchLabel: string;
  /** One extra filter on a column's exact value (e.g. the reading's source). */
  filter?: { columnId: string; label: string; anyLabel: string; options: SelectOption[] };
  /** The CSV export of the rows shown (after filters and sorting), and its file name. */
  csv: { columns: CsvColumn<T>[]; fileName: string };
  /** A link to the whole range as CSV from the server. */
  serverCsvHref?: string;
};

/**
 * A records table (@tanstack/react-table v9): sort by any header, search, one filter, 20 rows a
 * page, and an export of the filtered rows as CSV (cells neutralised against formulas).
 */
export function RecordsTable<T extends RowData>({
  noun,
  caption,
  data,
  columns,
  initialSort,
  searchColumns,
  searchLabel,
  filter,
  csv,
  serverCsvHref,
}: RecordsTableProps<T>) {
  const id = useId();
  const [search, setSearch] = useState("");
  const [choice, setChoice] = useState("");
  const table = useTable({
    features: recordFeatures,
    columns,
    data,
    initialState: { sorting: [initialSort], pagination: { pageIndex: 0, pageSize: PAGE_SIZE } },
    globalFilterFn: "includesString",
    getColumnCanGlobalFilter: (column) => searchColumns.includes(column.id),
  });

  const apply = (next: { search?: string; choice?: string }) => {
    const s = next.search ?? search;
    const c = next.choice ?? choice;
    setSearch(s);
    setChoice(c);
    table.setGlobalFilter(s);
    if (filter) table.getColumn(filter.columnId)?.setFilterValue(c || undefined);
    table.setPageIndex(0);
  };

  const exportShown = () => {
    const rows = table.getSortedRowModel().rows.map((r) => r.original);
    downloadText(csv.fileName, toCsv(csv.columns, rows));
  };

  const rows = table.getRowModel().rows;
  const total = table.getFilteredRowModel().rows.length;
  const { pageIndex } = table.state.pagination;
  const first = total === 0 ? 0 : pageIndex * PAGE_SIZE + 1;
  const last = Math.min(total, (pageIndex + 1) * PAGE_SIZE);

  return (
    <div className="flex flex-col gap-4">
      <div role="search" aria-label={`Filter ${noun}`} className="grid gap-4 sm:grid-cols-2">
        <Field label={searchLabel}>
          <Input type="search" value={search} onChange={(e) => apply({ search: e.target.value })} autoComplete="off" />
        </Field>
        {filter ? (
          <Field label={filter.label}>
            <Select
              value={choice}
              onChange={(e) => apply({ choice: e.target.value })}
              placeholder={filter.anyLabel}
              options={filter.options}
            />
          </Field>
        ) : null}
      </div>
      <div className="flex flex-wrap items-center gap-3">
        <p id={`${id}-count`} role="status" className="text-base text-muted">
          {total === 0
            ? `No ${noun} match.`
            : `Showing ${first.toLocaleString("en-GB")}–${last.toLocaleString("en-GB")} of ${total.toLocaleString("en-GB")} ${noun}.`}
        </p>
        <Button type="button" variant="outline" size="sm" onClick={exportShown} disabled={total === 0}>
          <Download aria-hidden="true" className="size-5" />
          Export these {noun} as CSV
        </Button>
        {serverCsvHref ? (
          <a href={serverCsvHref} download className="inline-flex min-h-11 items-center font-bold underline">
            Download all {noun} of the last 60 days
          </a>
        ) : null}
      </div>
      {total === 0 ? (
        <EmptyState title={data.length === 0 ? `No ${noun} yet` : `No ${noun} match these filters`} headingLevel={3} />
      ) : (
        <Table label={caption} aria-describedby={`${id}-count`}>
          <TableCaption className="sr-only">{caption}</TableCaption>
          <SortableHead groups={table.getHeaderGroups()} render={(header) => <table.FlexRender header={header} />} />
          <TBody>
            {rows.map((row) => (
              <TR key={row.id}>
                {row.getAllCells().map((cell) => (
                  <TD key={cell.id}>
                    <table.FlexRender cell={cell} />
                  </TD>
                ))}
              </TR>
            ))}
          </TBody>
        </Table>
      )}
      <TablePager
        noun={noun}
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
