import type { ComponentProps } from "react";
import { cn } from "@/lib/cn";

/** A placeholder block while data loads; hidden from screen readers, so announce loading elsewhere (e.g. Spinner's label). */
export function Skeleton({ className, ...props }: ComponentProps<"div">) {
  return (
    <div
      aria-hidden="true"
      className={cn("rounded-md bg-surface-muted motion-safe:animate-pulse", className)}
      {...props}
    />
  );
}
