import type { ReactNode } from "react";
import type { SortDirection as TableSortDirection } from "@tanstack/react-table";
import { TH, THead, TR } from "@/components/ui";
import { ariaSort } from "./aria-sort";

/** The part of a react-table header this head needs (any table with the sorting feature has it). */
export interface SortableHeader {
  id: string;
  isPlaceholder: boolean;
  column: {
    getCanSort: () => boolean;
    getIsSorted: () => false | TableSortDirection;
    toggleSorting: (desc?: boolean) => void;
  };
}

export interface SortableHeadProps<H extends SortableHeader> {
  /** `table.getHeaderGroups()`. */
  groups: readonly { id: string; headers: readonly H[] }[];
  /** Draws one header's content, e.g. `(h) => <table.FlexRender header={h} />`. */
  render: (header: H) => ReactNode;
}

/** A data table's head: every sortable column header is a button with `aria-sort`; a click flips the order. */
export function SortableHead<H extends SortableHeader>({ groups, render }: SortableHeadProps<H>) {
  return (
    <THead>
      {groups.map((group) => (
        <TR key={group.id}>
          {group.headers.map((header) => {
            const canSort = header.column.getCanSort();
            return (
              <TH
                key={header.id}
                sort={canSort ? ariaSort(header.column.getIsSorted()) : undefined}
                onSort={canSort ? () => header.column.toggleSorting(header.column.getIsSorted() === "asc") : undefined}
              >
                {header.isPlaceholder ? null : render(header)}
              </TH>
            );
          })}
        </TR>
      ))}
    </THead>
  );
}
