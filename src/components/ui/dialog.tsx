import { useEffect, useId, useRef, type ReactNode } from 'react';
import { cn } from '@/lib/cn';

interface DialogProps {
  open: boolean;
  onClose: () => void;
  title: ReactNode;
  description?: ReactNode;
  /** 'panel' slides in from the right edge (forms); 'center' is a small confirmation box. */
  variant?: 'panel' | 'center';
  children: ReactNode;
}

/**
 * A modal on the native <dialog>: the browser traps focus, closes on Escape, makes the rest of
 * the page inert and returns focus to the opener. We only sync `open` with showModal()/close().
 */
export function Dialog({ open, onClose, title, description, variant = 'center', children }: DialogProps) {
  const ref = useRef<HTMLDialogElement>(null);
  const titleId = useId();
  const descriptionId = useId();

  useEffect(() => {
    const dialog = ref.current;
    if (!dialog) return;
    if (open && !dialog.open) {
      dialog.showModal();
      // showModal() focuses the first control (the close button); forms mark their first field.
      dialog.querySelector<HTMLElement>('[data-autofocus]')?.focus();
    }
    if (!open && dialog.open) dialog.close();
  }, [open]);

  return (
    <dialog
      ref={ref}
      aria-labelledby={titleId}
      aria-describedby={description ? descriptionId : undefined}
      onClose={onClose}
      onCancel={(event) => {
        event.preventDefault();
        onClose();
      }}
      className={cn(
        'bg-white p-0 text-ink-950 shadow-2xl',
        variant === 'panel'
          ? 'my-0 mr-0 ml-auto h-dvh max-h-dvh w-full max-w-xl'
          : 'm-auto w-[min(32rem,calc(100vw-2rem))] rounded-xl',
      )}
    >
      {open && (
        <div className="flex h-full flex-col">
          <div className="flex items-start justify-between gap-4 border-b border-loam-200 px-6 py-4">
            <div>
              <h2 id={titleId} className="text-xl font-bold text-ink-900">
                {title}
              </h2>
              {description && (
                <p id={descriptionId} className="mt-1 text-loam-700">
                  {description}
                </p>
              )}
            </div>
            <button
              type="button"
              onClick={onClose}
              className="-mr-2 inline-flex size-11 shrink-0 items-center justify-center rounded-lg text-ink-700 hover:bg-loam-100"
              aria-label="Close"
            >
              <svg viewBox="0 0 20 20" className="size-5" aria-hidden="true">
                <path d="M5 5l10 10M15 5 5 15" stroke="currentColor" strokeWidth="2" strokeLinecap="round" />
              </svg>
            </button>
          </div>
          <div className="flex-1 overflow-y-auto px-6 py-5">{children}</div>
        </div>
      )}
    </dialog>
  );
}
