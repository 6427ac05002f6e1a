/**
 * A modal dialog on the native <dialog> element: focus is kept inside, Escape closes it,
 * the page behind cannot be used until it is closed, and focus returns to the opener after.
 */
import { useEffect, useRef } from 'react';
import type { ReactNode } from 'react';

export interface DialogProps {
  open: boolean;
  title: string;
  onClose: () => void;
  children: ReactNode;
  /** Tailwind max-width class. */
  width?: string;
}

/** A modal dialog with a title and a close button. */
export function Dialog({ open, title, onClose, children, width = 'max-w-lg' }: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  // The control that opened the dialog gets the focus back when it closes.
  useEffect(() => {
    if (!open) return;
    const opener = document.activeElement instanceof HTMLElement ? document.activeElement : null;
    return () => {
      if (opener?.isConnected) opener.focus();
    };
  }, [open]);
  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      if (typeof dialog.showModal === 'function') dialog.showModal();
      else dialog.setAttribute('open', '');
      // The first field takes the typing (showModal alone would focus the close button).
      dialog.querySelector<HTMLElement>('input:not([type="hidden"], [type="checkbox"], [type="radio"]), textarea, select')?.focus();
    }
    if (!open && dialog.open) {
      if (typeof dialog.close === 'function') dialog.close();
      else dialog.removeAttribute('open');
    }
  }, [open]);
  if (!open) return null;
  return (
    <dialog
      ref={ref}
      aria-label={title}
      onCancel={(event) => {
        event.preventDefault();
        onClose();
      }}
      className={`m-auto w-[calc(100%-2rem)] ${width} rounded-xl border border-rule bg-panel p-0 text-ink shadow-xl backdrop:bg-black/40`}
    >
      <div className="flex items-center justify-between border-b border-rule px-5 py-3">
        <h2 className="text-lg font-semibold">{title}</h2>
        <button type="button" onClick={onClose} className="rounded px-2 py-1 text-ink-soft hover:bg-sunken" aria-label="Close">
          ×
        </button>
      </div>
      <div className="px-5 py-4">{children}</div>
    </dialog>
  );
}
