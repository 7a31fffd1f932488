import { useEffect, useId, useRef, type ReactNode } from 'react';
import { createPortal } from 'react-dom';

/**
 * A modal panel for a small form opened from inside a bigger one (adding an animal to a visit
 * report). It is drawn on document.body, so its <form> is never nested in the page's own, and its
 * submit stops here instead of bubbling through React to the outer form. A sheet from the bottom
 * on a phone, a centred panel on a desktop; the native dialog keeps focus inside and closes on
 * Escape.
 */
export function SheetDialog({
  title,
  onClose,
  children,
}: {
  title: string;
  onClose: () => void;
  children: ReactNode;
}) {
  const ref = useRef<HTMLDialogElement>(null);
  const id = useId();
  useEffect(() => {
    const dialog = ref.current;
    if (dialog && !dialog.open) dialog.showModal();
  }, []);
  return createPortal(
    <dialog
      ref={ref}
      aria-labelledby={`${id}-title`}
      onClose={onClose}
      onSubmit={(event) => event.stopPropagation()}
      className="fixed inset-x-0 bottom-0 mx-auto mb-0 max-h-[90dvh] w-full max-w-lg overflow-y-auto rounded-t-card bg-white p-4 text-ink-950 shadow-card backdrop:bg-ink-950/60 sm:inset-0 sm:m-auto sm:h-fit sm:rounded-card sm:p-6"
    >
      <h2 id={`${id}-title`} className="text-xl font-bold text-ink-900">
        {title}
      </h2>
      <div className="mt-3">{children}</div>
    </dialog>,
    document.body,
  );
}
