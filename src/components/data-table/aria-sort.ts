import type { SortDirection as TableSortDirection } from "@tanstack/react-table";
import type { SortDirection } from "@/components/ui";

/** react-table's sort state as the `aria-sort` value our TH primitive takes. */
export function ariaSort(sorted: false | TableSortDirection): SortDirection {
  return sorted === "asc" ? "ascending" : sorted === "desc" ? "descending" : "none";
}
