import { useId, type ChangeEvent, type ComponentProps, type ReactNode } from "react";
import { cn } from "@/lib/cn";
import { FieldError } from "./field";

export type RadioOption = {
  value: string;
  label: ReactNode;
  description?: ReactNode;
  disabled?: boolean;
};

export type RadioGroupProps = {
  legend: ReactNode;
  options: RadioOption[];
  /** Shared input name; defaults to `radioProps.name`, then a generated one. */
  name?: string;
  /** Controlled value. */
  value?: string;
  defaultValue?: string;
  onValueChange?: (value: string) => void;
  hint?: ReactNode;
  error?: ReactNode;
  required?: boolean;
  disabled?: boolean;
  id?: string;
  /** "grid" lays cards side by side from the sm breakpoint; "stack" keeps one per row. */
  layout?: "stack" | "grid";
  className?: string;
  /** Spread on every radio input, e.g. react-hook-form's `register("field")` (name, onChange, onBlur, ref). */
  radioProps?: Omit<ComponentProps<"input">, "type" | "value" | "checked" | "defaultChecked" | "id">;
};

/**
 * A fieldset of radio buttons drawn as large tappable cards. The native radio
 * stays visible inside each card so the chosen one is shown by the dot as well
 * as the card's colour, and arrow keys work as browsers define them.
 */
export function RadioGroup({
  legend,
  options,
  name,
  value,
  defaultValue,
  onValueChange,
  hint,
  error,
  required,
  disabled,
  id,
  layout = "stack",
  className,
  radioProps,
}: RadioGroupProps) {
  const generatedId = useId();
  const groupId = id ?? generatedId;
  const inputName = radioProps?.name ?? name ?? groupId;
  const legendId = `${groupId}-legend`;
  const hintId = `${groupId}-hint`;
  const errorId = `${groupId}-error`;
  const hasError = error !== undefined && error !== null && error !== false && error !== "";
  const describedBy = [hint ? hintId : undefined, hasError ? errorId : undefined].filter(Boolean).join(" ");

  const handleChange = (event: ChangeEvent<HTMLInputElement>) => {
    radioProps?.onChange?.(event);
    onValueChange?.(event.target.value);
  };

  return (
    // role="radiogroup" (allowed on fieldset) is what may carry aria-required and aria-invalid;
    // native `required` on the radios would pop browser bubbles over our own error text.
    <fieldset
      id={groupId}
      role="radiogroup"
      disabled={disabled}
      aria-labelledby={legendId}
      aria-describedby={describedBy || undefined}
      aria-required={required || undefined}
      aria-invalid={hasError || undefined}
      className={cn("flex min-w-0 flex-col gap-2", className)}
    >
      <legend id={legendId} className="mb-1 font-bold text-foreground">
        {legend}
        {required ? (
          <span aria-hidden="true" className="font-normal text-muted">
            {" "}
            (required)
          </span>
        ) : null}
      </legend>
      {hint ? (
        <p id={hintId} className="text-base text-muted">
          {hint}
        </p>
      ) : null}
      <div className={cn("grid gap-2", layout === "grid" && "sm:grid-cols-2")}>
        {options.map((option, index) => {
          const optionId = `${groupId}-option-${index}`;
          const descriptionId = option.description ? `${optionId}-description` : undefined;
          return (
            <label
              key={option.value}
              htmlFor={optionId}
              className={cn(
                "flex min-h-11 cursor-pointer items-start gap-3 rounded-md border-2 border-border bg-surface p-3",
                "hover:bg-surface-muted has-[:checked]:border-primary has-[:checked]:bg-primary-subtle",
                // The input is the focused element; draw the ring around the whole card so it is easy to see.
                "has-[:focus-visible]:outline-3 has-[:focus-visible]:outline-offset-2 has-[:focus-visible]:outline-ring",
                "has-[:disabled]:cursor-not-allowed has-[:disabled]:opacity-60",
                hasError && "border-danger",
              )}
            >
              <input
                {...radioProps}
                type="radio"
                id={optionId}
                name={inputName}
                value={option.value}
                disabled={option.disabled || radioProps?.disabled}
                aria-describedby={descriptionId}
                onChange={handleChange}
                className="mt-0.5 size-6 shrink-0 cursor-pointer accent-primary focus-visible:outline-none"
                {...(value !== undefined
                  ? { checked: value === option.value }
                  : defaultValue !== undefined
                    ? { defaultChecked: defaultValue === option.value }
                    : {})}
              />
              <span className="flex flex-col">
                <span className="font-bold">{option.label}</span>
                {option.description ? (
                  <span id={descriptionId} className="text-base text-muted">
                    {option.description}
                  </span>
                ) : null}
              </span>
            </label>
          );
        })}
      </div>
      {hasError ? <FieldError id={errorId}>{error}</FieldError> : null}
    </fieldset>
  );
}
