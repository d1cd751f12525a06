import { useId, type ComponentProps, type ReactNode } from "react";
import { ShieldExclamationPoint } from "lucide-react";
import { cn } from "@/lib/cn";
import type { HeadingLevel } from "./card";

export type CautionProps = Omit<ComponentProps<"div">, "title" | "children"> & {
  /** The precautions, one sentence each. */
  items: string[];
  title?: string;
  headingLevel?: HeadingLevel;
  /** Replaces the closing line about local rules, when a screen needs a more specific one. */
  closing?: ReactNode;
};

/**
 * The safety box shown beside gas, pressure, heating and digestate advice
 * (PRODUCT.md; DOMAIN.md §6): the product gives estimates, and local rules,
 * suppliers and licensed practitioners decide.
 */
export function Caution({ items, title = "Safety", headingLevel = 2, closing, className, ...props }: CautionProps) {
  const headingId = useId();
  const Heading = `h${headingLevel}` as const;
  return (
    // role="note": advisory content that belongs to the surrounding screen, not a landmark of its own.
    <div
      role="note"
      aria-labelledby={headingId}
      className={cn("rounded-md border-2 border-warning bg-warning-subtle p-4 text-foreground", className)}
      {...props}
    >
      <Heading id={headingId} className="flex items-center gap-2 text-lg font-bold">
        <ShieldExclamationPoint aria-hidden="true" className="size-6 shrink-0 text-warning" />
        {title}
      </Heading>
      <ul className="mt-2 list-disc space-y-1 pl-6">
        {items.map((item) => (
          <li key={item}>{item}</li>
        ))}
      </ul>
      <p className="mt-3 text-base">
        {closing ??
          "These are estimates and common precautions, not a permit. Local gas, building and waste rules, the supplier's instructions and licensed practitioners decide."}
      </p>
    </div>
  );
}
