import { useEffect, useId, useLayoutEffect, useRef, useState, type KeyboardEvent, type ReactNode } from 'react';
import { cn } from '@/lib/cn';

export type MenuEntry =
  | { kind: 'item'; key: string; label: ReactNode; onSelect: () => void; checked?: boolean; disabled?: boolean }
  | { kind: 'heading'; key: string; label: ReactNode };

/**
 * A button that opens a short list of actions (role "menu"): arrow keys move, Enter chooses,
 * Escape or a click elsewhere closes and returns focus to the button. The list is placed with
 * fixed coordinates so a scrolling season column never clips it.
 */
export function ActionMenu({ label, buttonContent, entries, className }: { label: string; buttonContent: ReactNode; entries: MenuEntry[]; className?: string }) {
  const [open, setOpen] = useState(false);
  const [place, setPlace] = useState<{ top: number; left: number } | null>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);
  const menuRef = useRef<HTMLDivElement>(null);
  const menuId = useId();

  const items = () => Array.from(menuRef.current?.querySelectorAll<HTMLElement>('[role^="menuitem"]:not([aria-disabled="true"])') ?? []);
  const close = (focusButton = true) => {
    setOpen(false);
    if (focusButton) buttonRef.current?.focus();
  };

  useLayoutEffect(() => {
    if (!open || !buttonRef.current || !menuRef.current) return;
    const button = buttonRef.current.getBoundingClientRect();
    const menu = menuRef.current.getBoundingClientRect();
    const below = button.bottom + 4;
    const top = below + menu.height > window.innerHeight - 8 ? Math.max(8, button.top - 4 - menu.height) : below;
    const left = Math.min(Math.max(8, button.right - menu.width), window.innerWidth - menu.width - 8);
    setPlace({ top, left });
    const list = items();
    (list.find((el) => el.getAttribute('aria-checked') === 'true') ?? list[0])?.focus();
  }, [open]);

  useEffect(() => {
    if (!open) return;
    const onPointer = (event: PointerEvent) => {
      if (!menuRef.current?.contains(event.target as Node) && !buttonRef.current?.contains(event.target as Node)) close(false);
    };
    const onScroll = (event: Event) => {
      if (!menuRef.current?.contains(event.target as Node)) close(false);
    };
    document.addEventListener('pointerdown', onPointer);
    window.addEventListener('scroll', onScroll, true);
    window.addEventListener('resize', onScroll);
    return () => {
      document.removeEventListener('pointerdown', onPointer);
      window.removeEventListener('scroll', onScroll, true);
      window.removeEventListener('resize', onScroll);
    };
  }, [open]);

  const onMenuKey = (event: KeyboardEvent) => {
    const list = items();
    const at = list.indexOf(document.activeElement as HTMLElement);
    const go = (i: number) => list[(i + list.length) % list.length]?.focus();
    if (event.key === 'ArrowDown') go(at + 1);
    else if (event.key === 'ArrowUp') go(at - 1);
    else if (event.key === 'Home') go(0);
    else if (event.key === 'End') go(list.length - 1);
    else if (event.key === 'Escape') close();
    else if (event.key === 'Tab') close(false);
    else return;
    event.preventDefault();
  };

  return (
    <>
      <button
        ref={buttonRef}
        type="button"
        aria-haspopup="menu"
        aria-expanded={open}
        aria-controls={open ? menuId : undefined}
        aria-label={label}
        onClick={() => (open ? close() : setOpen(true))}
        onKeyDown={(event) => {
          if (event.key === 'ArrowDown' && !open) {
            event.preventDefault();
            setOpen(true);
          }
        }}
        className={cn('inline-flex min-h-11 items-center gap-1.5 rounded-lg border border-loam-400 bg-white font-semibold text-ink-800 hover:bg-loam-100', className ?? 'px-3')}
      >
        {buttonContent}
      </button>
      {open && (
        <div
          ref={menuRef}
          id={menuId}
          role="menu"
          aria-label={label}
          onKeyDown={onMenuKey}
          style={{ position: 'fixed', top: place?.top ?? -9999, left: place?.left ?? -9999 }}
          className="z-50 min-w-56 rounded-xl border border-loam-300 bg-white py-1.5 shadow-xl"
        >
          {entries.map((entry) =>
            entry.kind === 'heading' ? (
              <p key={entry.key} role="presentation" className="px-4 pt-2 pb-1 text-sm font-semibold text-loam-700">
                {entry.label}
              </p>
            ) : (
              <button
                key={entry.key}
                type="button"
                role={entry.checked === undefined ? 'menuitem' : 'menuitemradio'}
                aria-checked={entry.checked === undefined ? undefined : entry.checked}
                aria-disabled={entry.disabled || undefined}
                tabIndex={-1}
                onClick={() => {
                  if (entry.disabled) return;
                  close();
                  entry.onSelect();
                }}
                className={cn(
                  'flex min-h-11 w-full items-center gap-2 px-4 text-left text-ink-950 hover:bg-ink-50 focus:bg-ink-50 focus:outline-none',
                  entry.disabled && 'cursor-not-allowed text-loam-600',
                )}
              >
                {entry.checked !== undefined && (
                  <span className="inline-flex w-4 justify-center font-bold text-ink-800" aria-hidden="true">
                    {entry.checked ? '●' : ''}
                  </span>
                )}
                {entry.label}
              </button>
            ),
          )}
        </div>
      )}
    </>
  );
}
