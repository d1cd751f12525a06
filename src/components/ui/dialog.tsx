import { useEffect, useId, useRef, type ComponentProps, type KeyboardEvent, type ReactNode } from "react";
import { X } from "lucide-react";
import { cn } from "@/lib/cn";
import { Button } from "./button";

export type DialogProps = Omit<ComponentProps<"dialog">, "open" | "onClose" | "onCancel" | "title" | "children"> & {
  /** Controlled: the parent owns whether the dialog is shown. */
  open: boolean;
  /** Asked for by Escape, the close button or a `<form method="dialog">`; set `open` to false in it. */
  onClose: () => void;
  /** Visible heading; also the dialog's accessible name. */
  title: ReactNode;
  description?: ReactNode;
  children?: ReactNode;
  /** Action buttons, placed at the end. */
  footer?: ReactNode;
  closeLabel?: string;
};

function showDialog(dialog: HTMLDialogElement) {
  // Every supported browser has showModal (focus trap, inert page, top layer);
  // test DOMs may not, and there an `open` attribute is enough to show it.
  if (typeof dialog.showModal === "function") dialog.showModal();
  else dialog.setAttribute("open", "");
}

function hideDialog(dialog: HTMLDialogElement) {
  if (typeof dialog.close === "function") dialog.close();
  else dialog.removeAttribute("open");
}

/**
 * A modal on the native `<dialog>`: labelled by its title, closed by Escape,
 * and focus goes back to whatever opened it.
 */
export function Dialog({
  open,
  onClose,
  title,
  description,
  children,
  footer,
  closeLabel = "Close",
  className,
  ...props
}: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const openerRef = useRef<HTMLElement | null>(null);
  const titleId = useId();
  const descriptionId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open) {
      if (!dialog.open) {
        openerRef.current = document.activeElement instanceof HTMLElement ? document.activeElement : null;
        showDialog(dialog);
      }
      // Native showModal focuses the first focusable child; the fallback does not.
      if (!dialog.contains(document.activeElement)) dialog.focus();
    } else {
      if (dialog.open) hideDialog(dialog);
      openerRef.current?.focus();
      openerRef.current = null;
    }
  }, [open]);

  // Unmounted while open (e.g. a route change): still hand focus back.
  useEffect(() => {
    const dialog = ref.current;
    return () => {
      if (dialog && !dialog.isConnected) openerRef.current?.focus();
    };
  }, []);

  const handleKeyDown = (event: KeyboardEvent<HTMLDialogElement>) => {
    if (event.key === "Escape") {
      // Keep the parent's state the single source of truth instead of letting the browser close it.
      event.preventDefault();
      onClose();
    }
  };

  return (
    <dialog
      ref={ref}
      tabIndex={-1}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onKeyDown={handleKeyDown}
      onCancel={(event) => {
        event.preventDefault();
        onClose();
      }}
      onClose={() => {
        // Closed by the browser (e.g. <form method="dialog">) while the parent still thinks it is open.
        if (open) onClose();
      }}
      className={cn(
        "m-auto max-h-[calc(100dvh-2rem)] w-[calc(100%-2rem)] max-w-lg overflow-y-auto rounded-lg border border-border",
        "bg-surface p-0 text-foreground shadow-xl backdrop:bg-overlay",
        className,
      )}
      {...props}
    >
      {open ? (
        <div className="flex flex-col gap-4 p-4 sm:p-6">
          <div className="flex items-start justify-between gap-3">
            <div className="flex flex-col gap-1">
              <h2 id={titleId} className="text-xl font-bold">
                {title}
              </h2>
              {description ? (
                <p id={descriptionId} className="text-base text-muted">
                  {description}
                </p>
              ) : null}
            </div>
            <Button
              type="button"
              variant="ghost"
              size="sm"
              onClick={onClose}
              aria-label={closeLabel}
              className="-mt-1 -mr-2 shrink-0"
            >
              <X aria-hidden="true" className="size-6" />
            </Button>
          </div>
          {children}
          {footer ? <div className="flex flex-wrap justify-end gap-2">{footer}</div> : null}
        </div>
      ) : null}
    </dialog>
  );
}
