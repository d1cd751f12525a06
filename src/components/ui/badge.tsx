import type { ComponentProps, ReactNode } from "react";
import { CircleCheck, Info, OctagonExclamationPoint, TriangleExclamationPoint, type LucideIcon } from "lucide-react";
import { cn } from "@/lib/cn";

export type BadgeTone = "neutral" | "primary" | "accent" | "info" | "success" | "warning" | "danger";

const tones: Record<BadgeTone, { classes: string; icon?: LucideIcon }> = {
  neutral: { classes: "border-border bg-surface-muted text-foreground" },
  primary: { classes: "border-primary bg-primary-subtle text-primary" },
  accent: { classes: "border-accent bg-accent-subtle text-accent" },
  info: { classes: "border-info bg-info-subtle text-info", icon: Info },
  success: { classes: "border-success bg-success-subtle text-success", icon: CircleCheck },
  warning: { classes: "border-warning bg-warning-subtle text-warning", icon: TriangleExclamationPoint },
  danger: { classes: "border-danger bg-danger-subtle text-danger", icon: OctagonExclamationPoint },
};

export type BadgeProps = Omit<ComponentProps<"span">, "children"> & {
  tone?: BadgeTone;
  /** Icon before the text; status tones have a default, `null` removes it. */
  icon?: ReactNode;
  /** The status in words: a badge is never colour alone. */
  children: ReactNode;
};

export function Badge({ tone = "neutral", icon, className, children, ...props }: BadgeProps) {
  const { classes, icon: DefaultIcon } = tones[tone];
  const shownIcon = icon === undefined ? DefaultIcon ? <DefaultIcon /> : null : icon;
  return (
    <span
      className={cn(
        "inline-flex items-center gap-1 rounded-full border px-2.5 py-0.5 text-base font-bold whitespace-nowrap",
        "[&_svg]:size-4 [&_svg]:shrink-0",
        classes,
        className,
      )}
      {...props}
    >
      {shownIcon ? (
        <span aria-hidden="true" className="inline-flex">
          {shownIcon}
        </span>
      ) : null}
      {children}
    </span>
  );
}
