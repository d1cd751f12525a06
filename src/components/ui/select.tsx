import type { ComponentProps } from "react";
import { cn } from "@/lib/cn";
import { controlClasses } from "./input";

export type SelectOption = { value: string; label: string; disabled?: boolean };

export type SelectProps = ComponentProps<"select"> & {
  /** Options to render; `children` (own `<option>`s) are rendered after them. */
  options?: SelectOption[];
  /** Text of a first, empty-valued option such as "Choose a digester". */
  placeholder?: string;
};

/** A native `<select>` (keyboard, screen-reader and mobile pickers come for free); wrap it in Field. */
export function Select({ options, placeholder, className, children, ...props }: SelectProps) {
  return (
    <select className={cn(controlClasses, "pr-8", className)} {...props}>
      {placeholder !== undefined ? <option value="">{placeholder}</option> : null}
      {options?.map((option) => (
        <option key={option.value} value={option.value} disabled={option.disabled}>
          {option.label}
        </option>
      ))}
      {children}
    </select>
  );
}
