import type { ReactNode } from "react";
import { cn } from "@/lib/cn";

export type PageHeaderProps = {
  /** The page's one h1. */
  title: ReactNode;
  description?: ReactNode;
  /** Buttons or links for the page's main actions. */
  actions?: ReactNode;
  className?: string;
  children?: ReactNode;
};

export function PageHeader({ title, description, actions, className, children }: PageHeaderProps) {
  return (
    <header className={cn("mb-6 flex flex-col gap-3 sm:flex-row sm:items-start sm:justify-between", className)}>
      <div className="flex min-w-0 flex-col gap-1">
        <h1 className="text-3xl leading-tight font-bold break-words">{title}</h1>
        {description ? <p className="text-muted">{description}</p> : null}
        {children}
      </div>
      {actions ? (
        <div className="flex flex-wrap gap-2" data-print-hide>
          {actions}
        </div>
      ) : null}
    </header>
  );
}
