import type { ComponentProps, ReactNode } from "react";
import { CircleCheck, Info, OctagonExclamationPoint, TriangleExclamationPoint, type LucideIcon } from "lucide-react";
import { cn } from "@/lib/cn";

export type AlertVariant = "info" | "success" | "warning" | "danger";

// Each variant differs by icon shape and by its text title as well as by colour (WCAG 1.4.1).
const variants: Record<AlertVariant, { icon: LucideIcon; box: string; iconColour: string }> = {
  info: { icon: Info, box: "border-info bg-info-subtle", iconColour: "text-info" },
  success: { icon: CircleCheck, box: "border-success bg-success-subtle", iconColour: "text-success" },
  warning: { icon: TriangleExclamationPoint, box: "border-warning bg-warning-subtle", iconColour: "text-warning" },
  danger: { icon: OctagonExclamationPoint, box: "border-danger bg-danger-subtle", iconColour: "text-danger" },
};

export type AlertProps = Omit<ComponentProps<"div">, "title" | "role"> & {
  variant?: AlertVariant;
  /** Required text title, e.g. "Saved" or "Digester is resting". */
  title: ReactNode;
  /**
   * How a change is announced: "polite" (role="status", the default), "assertive"
   * (role="alert", for errors that need attention now) or "off" (static notice shown with the page).
   */
  announce?: "polite" | "assertive" | "off";
};

export function Alert({ variant = "info", title, announce = "polite", className, children, ...props }: AlertProps) {
  const { icon: Icon, box, iconColour } = variants[variant];
  const role = announce === "assertive" ? "alert" : announce === "polite" ? "status" : undefined;
  return (
    <div
      role={role}
      data-variant={variant}
      className={cn("flex gap-3 rounded-md border-l-4 p-4 text-foreground", box, className)}
      {...props}
    >
      <Icon aria-hidden="true" className={cn("mt-0.5 size-6 shrink-0", iconColour)} />
      <div className="flex min-w-0 flex-col gap-1">
        <p className="font-bold">{title}</p>
        {children ? <div className="[&_a]:underline">{children}</div> : null}
      </div>
    </div>
  );
}
