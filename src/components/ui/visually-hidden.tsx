import type { ComponentProps } from "react";
import { cn } from "@/lib/cn";

/** Text for screen readers only (e.g. "(opens in a new tab)", units spelled out). */
export function VisuallyHidden({ className, ...props }: ComponentProps<"span">) {
  return <span className={cn("sr-only", className)} {...props} />;
}
