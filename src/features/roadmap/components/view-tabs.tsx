import { useRef, type KeyboardEvent } from 'react';
import { cn } from '@/lib/cn';

export interface TabDef<T extends string> {
  id: T;
  label: string;
}

/** Tabs (role "tablist"): arrow keys move between them, the chosen one lives in the URL. */
export function ViewTabs<T extends string>({ tabs, current, onChange, label, idPrefix }: { tabs: TabDef<T>[]; current: T; onChange: (id: T) => void; label: string; idPrefix: string }) {
  const refs = useRef<(HTMLButtonElement | null)[]>([]);
  const onKey = (event: KeyboardEvent, index: number) => {
    let next = index;
    if (event.key === 'ArrowRight') next = (index + 1) % tabs.length;
    else if (event.key === 'ArrowLeft') next = (index - 1 + tabs.length) % tabs.length;
    else if (event.key === 'Home') next = 0;
    else if (event.key === 'End') next = tabs.length - 1;
    else return;
    event.preventDefault();
    onChange(tabs[next].id);
    refs.current[next]?.focus();
  };
  return (
    <div role="tablist" aria-label={label} className="mb-4 flex flex-wrap gap-1 border-b-2 border-loam-200">
      {tabs.map((tab, index) => {
        const selected = tab.id === current;
        return (
          <button
            key={tab.id}
            ref={(el) => {
              refs.current[index] = el;
            }}
            type="button"
            role="tab"
            id={`${idPrefix}-tab-${tab.id}`}
            aria-selected={selected}
            aria-controls={`${idPrefix}-panel-${tab.id}`}
            tabIndex={selected ? 0 : -1}
            onClick={() => onChange(tab.id)}
            onKeyDown={(event) => onKey(event, index)}
            className={cn(
              '-mb-0.5 inline-flex min-h-12 items-center border-b-4 px-4 text-lg font-semibold',
              selected ? 'border-ink-700 text-ink-900' : 'border-transparent text-loam-700 hover:border-loam-300 hover:text-ink-800',
            )}
          >
            {tab.label}
          </button>
        );
      })}
    </div>
  );
}
