import type { ReactNode } from "react";
import { Stat } from "@/components/ui";
import { cn } from "@/lib/cn";

export type ResultFigure = { label: string; value: string; unit?: string };

/** A calculator's answer: the one-sentence explanation first, then the figures. */
export function ResultPanel({
  sentence,
  figures,
  children,
}: {
  sentence: ReactNode;
  figures: ResultFigure[];
  children?: ReactNode;
}) {
  return (
    <div className="flex flex-col gap-3 rounded-lg border-2 border-primary bg-primary-subtle p-4">
      <p className="font-bold">{sentence}</p>
      {figures.length > 0 ? (
        // Four figures sit 2 × 2; others up to three a row, so no figure is left alone on a row of three.
        <div
          className={cn(
            "grid grid-cols-1 gap-3 sm:grid-cols-2",
            figures.length !== 4 && figures.length !== 2 && "xl:grid-cols-3",
          )}
        >
          {figures.map((figure) => (
            <Stat key={figure.label} label={figure.label} value={figure.value} unit={figure.unit} />
          ))}
        </div>
      ) : null}
      {children}
    </div>
  );
}
