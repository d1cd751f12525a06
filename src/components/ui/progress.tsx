import { useId, type ReactNode } from "react";
import { cn } from "@/lib/cn";

export type ProgressProps = {
  label: ReactNode;
  /** Omit for an indeterminate bar. */
  value?: number;
  max?: number;
  /** Visible value text; defaults to the rounded percentage. */
  valueText?: string;
  id?: string;
  className?: string;
};

/** A labelled native `<progress>` with its percentage written out, so the amount is not shown by bar length alone. */
export function Progress({ label, value, max = 100, valueText, id, className }: ProgressProps) {
  const generatedId = useId();
  const progressId = id ?? generatedId;
  const safeMax = max > 0 ? max : 1;
  const clamped = value === undefined ? undefined : Math.min(Math.max(value, 0), safeMax);
  const percent = clamped === undefined ? undefined : Math.round((clamped / safeMax) * 100);
  const text = valueText ?? (percent === undefined ? undefined : `${percent}%`);

  return (
    <div className={cn("flex flex-col gap-1", className)}>
      <div className="flex items-baseline justify-between gap-2">
        <label htmlFor={progressId} className="font-bold">
          {label}
        </label>
        {/* The progressbar already exposes its value to screen readers; this copy is for the eye. */}
        {text ? (
          <span aria-hidden="true" className="tabular-nums">
            {text}
          </span>
        ) : null}
      </div>
      <progress
        id={progressId}
        value={clamped}
        max={safeMax}
        aria-valuetext={valueText}
        className={cn(
          "h-3 w-full appearance-none overflow-hidden rounded-full border border-border bg-surface-muted",
          "[&::-webkit-progress-bar]:bg-surface-muted [&::-webkit-progress-value]:bg-primary [&::-moz-progress-bar]:bg-primary",
        )}
      />
    </div>
  );
}
