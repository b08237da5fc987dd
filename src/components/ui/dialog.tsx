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
      {open ? <ConfirmDialog title={title} message={message} confirmLabel={confirmLabel} danger={danger} onConfirm={onConfirm} onClose={() => setOpen(false)} /> : null}
    </>
  );
}

/**
 * The question itself, for an action that starts elsewhere (a picked option, a submitted
 * form): Cancel, or the confirm button that runs `onConfirm`. Either closes it.
 */
export function ConfirmDialog(props: { title: string; message: ReactNode; confirmLabel: string; danger?: boolean; onConfirm: () => void; onClose: () => void }) {
  return (
    <Dialog title={props.title} description={props.message} onClose={props.onClose}>
      <div className="mt-4 flex justify-end gap-2">
        <button type="button" className="btn-quiet" onClick={props.onClose}>
          Cancel
        </button>
        <button
          type="button"
          className={props.danger ? "btn-danger" : "btn-primary"}
          autoFocus
          onClick={() => {
            props.onClose();
            props.onConfirm();
          }}
        >
          {props.confirmLabel}
        </button>
      </div>
    </Dialog>
  );
}
