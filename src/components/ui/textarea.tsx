import type { ComponentProps } from "react";
import { cn } from "@/lib/cn";
import { controlClasses } from "./input";

export type TextareaProps = ComponentProps<"textarea">;

/** A `<textarea>` with the input look; wrap it in Field. */
export function Textarea({ className, rows = 4, ...props }: TextareaProps) {
  return <textarea rows={rows} className={cn(controlClasses, "min-h-24", className)} {...props} />;
}
