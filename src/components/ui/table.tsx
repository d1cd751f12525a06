import type { ComponentProps, ReactNode } from "react";
import { ArrowDown, ArrowUp, ArrowUpDown } from "lucide-react";
import { cn } from "@/lib/cn";

export type TableProps = ComponentProps<"table"> & {
  /** Name of the scroll region, e.g. "Drop-offs this week". */
  label: string;
  containerClassName?: string;
};

/**
 * A table inside its own horizontal scroll region, so a wide table scrolls by
 * itself at 320 px instead of the page (WCAG 1.4.10). The region is focusable
 * so keyboard users can scroll it, and named so they know what they are in.
 */
export function Table({ label, className, containerClassName, ...props }: TableProps) {
  return (
    <div
      role="region"
      aria-label={label}
      tabIndex={0}
      className={cn(
        "relative w-full max-w-full overflow-x-auto rounded-lg border border-border bg-surface",
        containerClassName,
      )}
    >
      <table className={cn("w-full border-collapse text-left", className)} {...props} />
    </div>
  );
}

export function TableCaption({ className, ...props }: ComponentProps<"caption">) {
  return <caption className={cn("px-4 py-3 text-left font-bold", className)} {...props} />;
}

export function THead({ className, ...props }: ComponentProps<"thead">) {
  return <thead className={cn("border-b-2 border-border bg-surface-muted", className)} {...props} />;
}

export function TBody({ className, ...props }: ComponentProps<"tbody">) {
  return (
    <tbody
      className={cn("[&>tr:not(:last-child)]:border-b [&>tr:not(:last-child)]:border-border", className)}
      {...props}
    />
  );
}

export function TR({ className, ...props }: ComponentProps<"tr">) {
  return <tr className={cn("hover:bg-surface-muted/60", className)} {...props} />;
}

export type SortDirection = "ascending" | "descending" | "none";

export type THProps = ComponentProps<"th"> & {
  /** Current sort of this column; sets aria-sort. Leave undefined on columns that cannot be sorted. */
  sort?: SortDirection;
  /** When given, the header text becomes a button that asks for a new sort. */
  onSort?: () => void;
};

const sortIcons = { ascending: ArrowUp, descending: ArrowDown, none: ArrowUpDown } as const;

export function TH({ sort, onSort, scope = "col", className, children, ...props }: THProps) {
  const SortIcon = sortIcons[sort ?? "none"];
  let content: ReactNode = children;
  if (onSort) {
    content = (
      <button
        type="button"
        onClick={onSort}
        className="-mx-2 inline-flex min-h-11 items-center gap-1 rounded-md px-2 font-bold hover:bg-surface"
      >
        {children}
        <SortIcon aria-hidden="true" className="size-4 shrink-0" />
      </button>
    );
  }
  return (
    <th
      scope={scope}
      aria-sort={sort}
      className={cn("px-4 py-2 align-bottom font-bold whitespace-nowrap", className)}
      {...props}
    >
      {content}
    </th>
  );
}

export function TD({ className, ...props }: ComponentProps<"td">) {
  return <td className={cn("px-4 py-3 align-top", className)} {...props} />;
}
