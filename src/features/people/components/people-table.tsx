import { useId, useMemo, useState } from "react";
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createPaginatedRowModel,
  createSortedRowModel,
  filterFn_arrIncludes,
  filterFn_equalsString,
  filterFn_includesString,
  globalFilteringFeature,
  rowPaginationFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_datetime,
  sortFn_text,
  tableFeatures,
  useTable,
} from "@tanstack/react-table";
import type { Role } from "@shared/schemas/auth";
import type { PersonRow } from "@shared/schemas/people";
import { Badge, Button, EmptyState, Field, Input, Select, Table, TableCaption, TBody, TD, TR } from "@/components/ui";
import { roleLabels, statusTone, statusLabels } from "../utils/labels";
import { SortableHead } from "@/components/data-table/sortable-head";
import { TablePager } from "@/components/data-table/table-pager";

const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  rowPaginationFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  paginatedRowModel: createPaginatedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, datetime: sortFn_datetime },
  filterFns: {
    includesString: filterFn_includesString,
    arrIncludes: filterFn_arrIncludes,
    equalsString: filterFn_equalsString,
  },
});

const helper = createColumnHelper<typeof features, PersonRow>();

const PAGE_SIZE = 10;

export type PeopleTableProps = {
  people: PersonRow[];
  digesterNames: Map<number, string>;
  onEdit: (person: PersonRow) => void;
};

/**
 * The coordinators' people table: sort by name, e-mail, status or date; search by name or
 * e-mail; filter by role and status; 10 people a page. Status is a word with an icon, never
 * colour alone.
 */
export function PeopleTable({ people, digesterNames, onEdit }: PeopleTableProps) {
  const id = useId();
  const [search, setSearch] = useState("");
  const [role, setRole] = useState("");
  const [status, setStatus] = useState("");

  const columns = useMemo(
    () =>
      helper.columns([
        helper.accessor("name", { header: "Name", sortFn: "text", filterFn: "includesString" }),
        helper.accessor("email", { header: "E-mail", sortFn: "text", filterFn: "includesString" }),
        helper.accessor("roles", {
          header: "Roles",
          enableSorting: false,
          enableGlobalFilter: false,
          filterFn: "arrIncludes",
          cell: (info) =>
            info.getValue().length
              ? info
                  .getValue()
                  .map((r: Role) => roleLabels[r])
                  .join(", ")
              : "None",
        }),
        helper.accessor("status", {
          header: "Status",
          sortFn: "text",
          enableGlobalFilter: false,
          filterFn: "equalsString",
          cell: (info) => <Badge tone={statusTone[info.getValue()]}>{statusLabels[info.getValue()]}</Badge>,
        }),
        helper.accessor("stewardOf", {
          header: "Looks after",
          enableSorting: false,
          enableGlobalFilter: false,
          cell: (info) =>
            info
              .getValue()
              .map((d: number) => digesterNames.get(d) ?? `Digester ${d}`)
              .join(", ") || "—",
        }),
        helper.accessor("householdName", {
          header: "Household",
          sortFn: "text",
          enableGlobalFilter: false,
          cell: (info) => info.getValue() ?? "—",
        }),
        helper.display({
          id: "actions",
          header: () => <span className="sr-only">Actions</span>,
          cell: (info) => (
            <Button type="button" variant="outline" size="sm" onClick={() => onEdit(info.row.original)}>
              Edit<span className="sr-only"> {info.row.original.name}</span>
            </Button>
          ),
        }),
      ]),
    [digesterNames, onEdit],
  );

  const table = useTable({
    features,
    columns,
    data: people,
    initialState: { sorting: [{ id: "name", desc: false }], pagination: { pageIndex: 0, pageSize: PAGE_SIZE } },
    globalFilterFn: "includesString",
    getColumnCanGlobalFilter: (column) => column.id === "name" || column.id === "email",
  });

  const applyFilters = (next: { search?: string; role?: string; status?: string }) => {
    const s = next.search ?? search;
    const r = next.role ?? role;
    const st = next.status ?? status;
    setSearch(s);
    setRole(r);
    setStatus(st);
    table.setGlobalFilter(s);
    // arrIncludes keeps rows holding any of the listed values, so it takes a list.
    table.getColumn("roles")?.setFilterValue(r ? [r] : undefined);
    table.getColumn("status")?.setFilterValue(st || undefined);
    table.setPageIndex(0);
  };

  const rows = table.getRowModel().rows;
  const total = table.getFilteredRowModel().rows.length;
  const { pageIndex } = table.state.pagination;
  const first = total === 0 ? 0 : pageIndex * PAGE_SIZE + 1;
  const last = Math.min(total, (pageIndex + 1) * PAGE_SIZE);

  return (
    <div className="flex flex-col gap-4">
      <div role="search" aria-label="Filter people" className="grid gap-4 sm:grid-cols-3">
        <Field label="Search by name or e-mail">
          <Input
            type="search"
            value={search}
            onChange={(e) => applyFilters({ search: e.target.value })}
            autoComplete="off"
          />
        </Field>
        <Field label="Role">
          <Select
            value={role}
            onChange={(e) => applyFilters({ role: e.target.value })}
            placeholder="Any role"
            options={(Object.keys(roleLabels) as Role[]).map((r) => ({ value: r, label: roleLabels[r] }))}
          />
        </Field>
        <Field label="Status">
          <Select
            value={status}
            onChange={(e) => applyFilters({ status: e.target.value })}
            placeholder="Any status"
            options={(Object.keys(statusLabels) as PersonRow["status"][]).map((s) => ({
              value: s,
              label: statusLabels[s],
            }))}
          />
        </Field>
      </div>
      <p id={`${id}-count`} role="status" className="text-base text-muted">
        {total === 0 ? "No one matches." : `Showing ${first}–${last} of ${total} ${total === 1 ? "person" : "people"}.`}
      </p>
      {total === 0 ? (
        <EmptyState
          title="No one matches these filters"
          description="Clear the search or choose another role or status."
        />
      ) : (
        <Table label="People" aria-describedby={`${id}-count`}>
          <TableCaption className="sr-only">People in the group, their roles and status</TableCaption>
          <SortableHead groups={table.getHeaderGroups()} render={(header) => <table.FlexRender header={header} />} />
          <TBody>
            {rows.map((row) => (
              <TR key={row.id}>
                {row.getAllCells().map((cell) => (
                  <TD key={cell.id} className={cell.column.id === "email" ? "break-all" : undefined}>
                    <table.FlexRender cell={cell} />
                  </TD>
                ))}
              </TR>
            ))}
          </TBody>
        </Table>
      )}
      <TablePager
        noun="people"
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
