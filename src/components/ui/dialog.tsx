"use client";
import { useEffect, useId, useRef, useState, type ReactNode } from "react";

/** A native <dialog> shown as a modal while the component holding the ref is mounted. */
export function useModalWhileMounted() {
  const ref = useRef<HTMLDialogElement>(null);
  useEffect(() => {
    const dialog = ref.current;
    if (dialog && !dialog.open) dialog.showModal();
    return () => dialog?.close();
  }, []);
  return ref;
}

/**
 * A modal on the native <dialog> (focus trap, Escape and the backdrop come from the browser).
 * Open while mounted; Escape calls onClose.
 */
export function Dialog({ title, description, onClose, children }: { title: string; description?: ReactNode; onClose: () => void; children: ReactNode }) {
  const ref = useModalWhileMounted();
  const titleId = useId();
  const descriptionId = useId();
  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onCancel={(e) => {
        e.preventDefault();
        onClose();
      }}
      className="m-auto w-full max-w-md rounded-card border border-paper-line bg-white p-5 text-graphite shadow-card backdrop:bg-graphite/40"
    >
      <h2 id={titleId} className="text-lg font-semibold">
        {title}
      </h2>
      {description ? (
        <p id={descriptionId} className="mt-2 text-sm text-graphite-soft">
          {description}
        </p>
      ) : null}
      {children}
    </dialog>
  );
}

/**
 * A button that asks before it acts: the dialog names what happens, and only "confirm"
 * runs `onConfirm`.
 */
export function ConfirmButton({
  label,
  title,
  message,
  confirmLabel,
  onConfirm,
  danger,
  disabled,
  ariaLabel,
  className,
}: {
  label: ReactNode;
  title: string;
  message: ReactNode;
  confirmLabel: string;
  onConfirm: () => void;
  danger?: boolean;
  disabled?: boolean;
  ariaLabel?: string;
  className?: string;
}) {
  const [open, setOpen] = useState(false);
  return (
    <>
      <button type="button" className={className ?? (danger ? "btn-danger" : "btn-quiet")} disabled={disabled} aria-label={ariaLabel} onClick={() => setOpen(true)}>
        {label}
      </button>
      {open ? (
        <Dialog title={title} description={message} onClose={() => setOpen(false)}>
          <div className="mt-4 flex justify-end gap-2">
            <button type="button" className="btn-quiet" onClick={() => setOpen(false)}>
              Cancel
            </button>
            <button
              type="button"
              className={danger ? "btn-danger" : "btn-primary"}
              autoFocus
              onClick={() => {
                setOpen(false);
                onConfirm();
              }}
            >
              {confirmLabel}
            </button>
          </div>
        </Dialog>
      ) : null}
    </>
  );
}
