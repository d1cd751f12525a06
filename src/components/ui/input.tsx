import type { ComponentProps } from "react";
import { cn } from "@/lib/cn";

/** Shared look of text-like controls; the border meets 3:1 (WCAG 1.4.11) and turns danger-coloured when invalid (the error text under it carries the meaning). */
export const controlClasses =
  "block w-full min-h-11 rounded-md border-2 border-border bg-surface px-3 py-2 text-lg text-foreground " +
  "placeholder:text-muted disabled:cursor-not-allowed disabled:bg-surface-muted " +
  "aria-invalid:border-danger";

export type InputProps = ComponentProps<"input">;

/** A text-like `<input>`; wrap it in Field for its label, hint and error. */
export function Input({ className, type = "text", ...props }: InputProps) {
  return <input type={type} className={cn(controlClasses, className)} {...props} />;
}
