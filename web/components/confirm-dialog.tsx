import { useEffect, useId, useRef, type ReactNode } from 'react';
import { Button } from './button';
import { FieldError } from './field-error';

interface ConfirmDialogProps {
  open: boolean;
  title: string;
  children: ReactNode;
  confirmLabel: string;
  /** The safe choice; "Cancel" unless that word would name the change itself ("Cancel visit"). */
  cancelLabel?: string;
  pendingLabel: string;
  pending: boolean;
  /** Why the last try failed; the dialog stays open so the person can try again or cancel. */
  error?: string;
  onConfirm: () => void;
  onClose: () => void;
}

/**
 * A modal question before a change that is hard to take back. The native dialog keeps focus
 * inside and closes on Escape; focus starts on Cancel, the safe choice, and the browser returns
 * it to the button that opened the dialog.
 */
export function ConfirmDialog({
  open,
  title,
  children,
  confirmLabel,
  cancelLabel = 'Cancel',
  pendingLabel,
  pending,
  error,
  onConfirm,
  onClose,
}: ConfirmDialogProps) {
  const dialogRef = useRef<HTMLDialogElement>(null);
  const id = useId();

  useEffect(() => {
    const dialog = dialogRef.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      dialog.showModal();
      dialog.querySelector<HTMLButtonElement>('[data-dialog-cancel]')?.focus();
    } else if (!open && dialog.open) {
      dialog.close();
    }
  }, [open]);

  return (
    <dialog
      ref={dialogRef}
      aria-labelledby={`${id}-title`}
      aria-describedby={`${id}-body`}
      onClose={onClose}
      className="fixed inset-0 m-auto h-fit w-[min(30rem,calc(100%-2rem))] rounded-card bg-white p-6 text-ink-950 shadow-card backdrop:bg-ink-950/60"
    >
      <h2 id={`${id}-title`} className="text-xl font-bold text-ink-900">
        {title}
      </h2>
      <div id={`${id}-body`} className="mt-3 space-y-2 text-ink-700">
        {children}
      </div>
      {error && (
        <div role="alert">
          <FieldError>{error}</FieldError>
        </div>
      )}
      <div className="mt-6 flex flex-col-reverse gap-2 sm:flex-row sm:justify-end">
        <Button data-dialog-cancel tone="secondary" onClick={onClose}>
          {cancelLabel}
        </Button>
        <Button tone="danger" onClick={onConfirm} disabled={pending}>
          {pending ? pendingLabel : confirmLabel}
        </Button>
      </div>
    </dialog>
  );
}
