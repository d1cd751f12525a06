import type { ComponentProps } from "react";
import { cn } from "@/lib/cn";
import { Spinner } from "./spinner";

export type ButtonVariant = "primary" | "secondary" | "outline" | "ghost" | "danger";
export type ButtonSize = "sm" | "md" | "lg";

// min-h-11/min-w-11 = 44 px: WCAG 2.5.5 target size, even for "sm".
const base =
  "inline-flex min-h-11 min-w-11 items-center justify-center gap-2 rounded-md font-bold no-underline " +
  "transition-colors select-none disabled:cursor-not-allowed disabled:opacity-60 aria-disabled:cursor-not-allowed aria-disabled:opacity-60";

const variantClasses: Record<ButtonVariant, string> = {
  primary: "bg-primary text-primary-foreground hover:bg-primary/90",
  secondary: "border-2 border-transparent bg-surface-muted text-foreground hover:border-border",
  outline: "border-2 border-primary bg-surface text-primary hover:bg-primary-subtle",
  ghost: "bg-transparent text-primary underline-offset-4 hover:bg-primary-subtle hover:underline",
  danger: "bg-danger text-danger-foreground hover:bg-danger/90",
};

const sizeClasses: Record<ButtonSize, string> = {
  sm: "px-3 py-1.5 text-base",
  md: "px-4 py-2 text-lg",
  lg: "min-h-14 px-6 py-3 text-xl",
};

/** Class string of a button, for elements that must look like one but are not `<button>` (router links). */
export function buttonClasses(variant: ButtonVariant = "primary", size: ButtonSize = "md", className?: string): string {
  return cn(base, variantClasses[variant], sizeClasses[size], className);
}

export type ButtonProps = ComponentProps<"button"> & {
  variant?: ButtonVariant;
  size?: ButtonSize;
  /** Shows a spinner beside the unchanged label, sets aria-busy and disables the button. */
  loading?: boolean;
};

/** A `<button>`; `type` keeps the HTML default ("submit" inside a form), so pass `type="button"` for actions that must not submit. */
export function Button({
  variant = "primary",
  size = "md",
  loading = false,
  disabled,
  className,
  children,
  ...props
}: ButtonProps) {
  return (
    <button
      className={buttonClasses(variant, size, className)}
      disabled={disabled || loading}
      aria-busy={loading || undefined}
      {...props}
    >
      {loading ? <Spinner size="sm" /> : null}
      {children}
    </button>
  );
}
