import { cloneElement, isValidElement, useId, type ReactElement, type ReactNode } from "react";
import { CircleExclamationPoint } from "lucide-react";
import { cn } from "@/lib/cn";

/** What Field hands its control so the label, hint and error are wired to it. */
export type FieldControlProps = {
  id: string;
  "aria-invalid"?: true;
  "aria-describedby"?: string;
  "aria-required"?: true;
};

export type FieldProps = {
  label: ReactNode;
  hint?: ReactNode;
  /** Error text shown under the control; when present the control is marked aria-invalid. */
  error?: ReactNode;
  required?: boolean;
  /** Control id; hint and error get `${id}-hint` and `${id}-error`. Generated when omitted. */
  id?: string;
  className?: string;
  /** One control element (cloned with the wiring props) or a render function receiving them. */
  children: ReactElement | ((control: FieldControlProps) => ReactNode);
};

export function Field({ label, hint, error, required, id, className, children }: FieldProps) {
  const generatedId = useId();
  const childProps: Record<string, unknown> =
    typeof children !== "function" && isValidElement<Record<string, unknown>>(children) ? children.props : {};
  const childId = typeof childProps.id === "string" ? childProps.id : undefined;
  const controlId = id ?? childId ?? generatedId;
  const hintId = `${controlId}-hint`;
  const errorId = `${controlId}-error`;
  const hasError = error !== undefined && error !== null && error !== false && error !== "";
  const ownDescribedBy =
    typeof childProps["aria-describedby"] === "string" ? childProps["aria-describedby"] : undefined;
  const describedBy = [ownDescribedBy, hint ? hintId : undefined, hasError ? errorId : undefined]
    .filter(Boolean)
    .join(" ");

  const control: FieldControlProps = {
    id: controlId,
    ...(hasError ? { "aria-invalid": true as const } : {}),
    ...(describedBy ? { "aria-describedby": describedBy } : {}),
    ...(required ? { "aria-required": true as const } : {}),
  };

  return (
    <div className={cn("flex flex-col gap-1.5", className)}>
      <label htmlFor={controlId} className="font-bold text-foreground">
        {label}
        {/* aria-required already tells screen readers; the word is for sighted people (no asterisk-only cue). */}
        {required ? (
          <span aria-hidden="true" className="font-normal text-muted">
            {" "}
            (required)
          </span>
        ) : null}
      </label>
      {hint ? (
        <p id={hintId} className="text-base text-muted">
          {hint}
        </p>
      ) : null}
      {typeof children === "function" ? children(control) : cloneElement(children, control)}
      {hasError ? <FieldError id={errorId}>{error}</FieldError> : null}
    </div>
  );
}

/** Error text with an icon and an "Error:" prefix for screen readers, so it is never colour alone. */
export function FieldError({ id, children, className }: { id: string; children: ReactNode; className?: string }) {
  return (
    <p id={id} role="none" className={cn("flex items-start gap-1.5 font-bold text-danger", className)}>
      <CircleExclamationPoint aria-hidden="true" className="mt-1 size-5 shrink-0" />
      <span>
        <span className="sr-only">Error: </span>
        {children}
      </span>
    </p>
  );
}
