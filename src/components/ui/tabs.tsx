import { useId, useRef, useState, type KeyboardEvent, type ReactNode } from "react";
import { cn } from "@/lib/cn";

export type TabItem = { value: string; label: ReactNode; content: ReactNode };

export type TabsProps = {
  items: TabItem[];
  /** Name of the tab list, e.g. "Digester views". */
  label: string;
  value?: string;
  defaultValue?: string;
  onValueChange?: (value: string) => void;
  className?: string;
};

/**
 * Tabs after the WAI-ARIA Authoring Practices pattern (automatic activation):
 * one tab stop, arrow keys move between tabs, Home/End jump to the ends.
 */
export function Tabs({ items, label, value, defaultValue, onValueChange, className }: TabsProps) {
  const baseId = useId();
  const [ownValue, setOwnValue] = useState(defaultValue ?? items[0]?.value);
  const current = value ?? ownValue;
  const tabRefs = useRef<(HTMLButtonElement | null)[]>([]);

  const select = (index: number) => {
    const item = items[index];
    if (!item) return;
    setOwnValue(item.value);
    onValueChange?.(item.value);
    tabRefs.current[index]?.focus();
  };

  const handleKeyDown = (event: KeyboardEvent<HTMLDivElement>) => {
    const index = items.findIndex((item) => item.value === current);
    const last = items.length - 1;
    const next =
      event.key === "ArrowRight"
        ? index >= last
          ? 0
          : index + 1
        : event.key === "ArrowLeft"
          ? index <= 0
            ? last
            : index - 1
          : event.key === "Home"
            ? 0
            : event.key === "End"
              ? last
              : undefined;
    if (next === undefined) return;
    event.preventDefault();
    select(next);
  };

  return (
    <div className={cn("flex flex-col gap-3", className)}>
      <div
        role="tablist"
        aria-label={label}
        onKeyDown={handleKeyDown}
        className="flex flex-wrap gap-1 border-b-2 border-border"
      >
        {items.map((item, index) => {
          const selected = item.value === current;
          return (
            <button
              key={item.value}
              ref={(element) => {
                tabRefs.current[index] = element;
              }}
              type="button"
              role="tab"
              id={`${baseId}-tab-${index}`}
              aria-selected={selected}
              aria-controls={`${baseId}-panel-${index}`}
              tabIndex={selected ? 0 : -1}
              onClick={() => select(index)}
              className={cn(
                // The selected tab is marked by a thick underline and bold text, not by colour alone.
                "-mb-0.5 min-h-11 min-w-11 border-b-4 border-transparent px-4 py-2 text-muted hover:text-foreground",
                selected && "border-primary font-bold text-foreground",
              )}
            >
              {item.label}
            </button>
          );
        })}
      </div>
      {items.map((item, index) => (
        <div
          key={item.value}
          role="tabpanel"
          id={`${baseId}-panel-${index}`}
          aria-labelledby={`${baseId}-tab-${index}`}
          tabIndex={0}
          hidden={item.value !== current}
        >
          {item.content}
        </div>
      ))}
    </div>
  );
}
