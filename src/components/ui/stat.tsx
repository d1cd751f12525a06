import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

export type StatProps = {
  label: ReactNode;
  value: ReactNode;
  /** Unit written after the value ("kg", "m³", "L"); never left for the reader to guess. */
  unit?: ReactNode;
  hint?: ReactNode;
  icon?: ReactNode;
  className?: string;
};

/** One headline figure as a description list (label → value), so screen readers pair them. */
export function Stat({ label, value, unit, hint, icon, className }: StatProps) {
  return (
    <dl className={cn("flex flex-col gap-1 rounded-lg border border-border bg-surface p-4", className)}>
      <dt className="flex items-center gap-2 text-base font-bold text-muted">
        {icon ? (
          <span aria-hidden="true" className="inline-flex [&_svg]:size-5">
            {icon}
          </span>
        ) : null}
        {label}
      </dt>
      <dd className="text-3xl leading-tight font-bold tabular-nums">
        {value}
        {unit ? <span className="ml-1 text-lg font-normal text-muted">{unit}</span> : null}
      </dd>
      {hint ? <dd className="text-base text-muted">{hint}</dd> : null}
    </dl>
  );
}
