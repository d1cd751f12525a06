import type { ReactNode } from "react";
import { Inbox } from "lucide-react";
import { cn } from "@/lib/cn";
import type { HeadingLevel } from "./card";

export type EmptyStateProps = {
  title: ReactNode;
  description?: ReactNode;
  /** Replaces the default tray icon. */
  icon?: ReactNode;
  /** What the person can do next, e.g. a Button. */
  action?: ReactNode;
  headingLevel?: HeadingLevel;
  className?: string;
};

export function EmptyState({ title, description, icon, action, headingLevel = 2, className }: EmptyStateProps) {
  const Heading = `h${headingLevel}` as const;
  return (
    <div
      className={cn(
        "flex flex-col items-center gap-2 rounded-lg border-2 border-dashed border-border bg-surface px-4 py-10 text-center",
        className,
      )}
    >
      <span aria-hidden="true" className="text-muted [&_svg]:size-10">
        {icon ?? <Inbox />}
      </span>
      <Heading className="text-xl font-bold">{title}</Heading>
      {description ? <p className="max-w-prose text-muted">{description}</p> : null}
      {action ? <div className="mt-2">{action}</div> : null}
    </div>
  );
}
