import { useId, type ComponentProps, type ReactNode } from "react";
import { cn } from "@/lib/cn";
import { FieldError } from "./field";

export type CheckboxProps = Omit<ComponentProps<"input">, "type"> & {
  label: ReactNode;
  hint?: ReactNode;
  error?: ReactNode;
};

/** A checkbox with its own label; the whole row (≥ 44 px tall) toggles it. */
export function Checkbox({
  label,
  hint,
  error,
  id,
  className,
  "aria-describedby": ownDescribedBy,
  ...props
}: CheckboxProps) {
  const generatedId = useId();
  const inputId = id ?? generatedId;
  const hintId = `${inputId}-hint`;
  const errorId = `${inputId}-error`;
  const hasError = error !== undefined && error !== null && error !== false && error !== "";
  const describedBy = [ownDescribedBy, hint ? hintId : undefined, hasError ? errorId : undefined]
    .filter(Boolean)
    .join(" ");

  return (
    <div className={cn("flex flex-col gap-1", className)}>
      <label htmlFor={inputId} className="flex min-h-11 cursor-pointer items-center gap-3">
        <input
          type="checkbox"
          id={inputId}
          className="size-6 shrink-0 cursor-pointer accent-primary disabled:cursor-not-allowed"
          aria-invalid={hasError || undefined}
          aria-describedby={describedBy || undefined}
          {...props}
        />
        <span>{label}</span>
      </label>
      {hint ? (
        <p id={hintId} className="pl-9 text-base text-muted">
          {hint}
        </p>
      ) : null}
      {hasError ? (
        <FieldError id={errorId} className="pl-9">
          {error}
        </FieldError>
      ) : null}
    </div>
  );
}
