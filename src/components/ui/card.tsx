import type { ComponentProps } from "react";
import { cn } from "@/lib/cn";

export function Card({ className, ...props }: ComponentProps<"div">) {
  return (
    <div
      className={cn("flex flex-col rounded-lg border border-border bg-surface text-foreground", className)}
      {...props}
    />
  );
}

export function CardHeader({ className, ...props }: ComponentProps<"div">) {
  return <div className={cn("flex flex-col gap-1 p-4 pb-2 sm:p-6 sm:pb-2", className)} {...props} />;
}

export type HeadingLevel = 1 | 2 | 3 | 4 | 5 | 6;

export type CardTitleProps = ComponentProps<"h2"> & {
  /** Heading level, so cards fit the page outline (WCAG 1.3.1); default 2. */
  level?: HeadingLevel;
};

export function CardTitle({ level = 2, className, ...props }: CardTitleProps) {
  const Heading = `h${level}` as const;
  return <Heading className={cn("text-xl leading-snug font-bold", className)} {...props} />;
}

export function CardDescription({ className, ...props }: ComponentProps<"p">) {
  return <p className={cn("text-base text-muted", className)} {...props} />;
}

export function CardContent({ className, ...props }: ComponentProps<"div">) {
  return <div className={cn("flex-1 p-4 pt-2 sm:p-6 sm:pt-2", className)} {...props} />;
}

export function CardFooter({ className, ...props }: ComponentProps<"div">) {
  return <div className={cn("flex flex-wrap items-center gap-2 p-4 pt-0 sm:p-6 sm:pt-0", className)} {...props} />;
}
