import type { ComponentProps } from "react";
import { LoaderCircle } from "lucide-react";
import { cn } from "@/lib/cn";

export type SpinnerSize = "sm" | "md" | "lg";

const sizeClasses: Record<SpinnerSize, string> = {
  sm: "size-4",
  md: "size-6",
  lg: "size-10",
};

export type SpinnerProps = Omit<ComponentProps<"span">, "children"> & {
  /** Announced text, e.g. "Loading readings". Without it the spinner is decorative (the caller announces). */
  label?: string;
  size?: SpinnerSize;
};

export function Spinner({ label, size = "md", className, ...props }: SpinnerProps) {
  return (
    <span role={label ? "status" : undefined} className={cn("inline-flex items-center gap-2", className)} {...props}>
      {/* motion-safe: people who ask for reduced motion get a still icon; the label carries the meaning. */}
      <LoaderCircle aria-hidden="true" className={cn("shrink-0 motion-safe:animate-spin", sizeClasses[size])} />
      {label ? <span className="sr-only">{label}</span> : null}
    </span>
  );
}
