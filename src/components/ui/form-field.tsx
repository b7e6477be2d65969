import { useId, type InputHTMLAttributes, type ReactNode, type Ref, type SelectHTMLAttributes } from 'react';
import { cn } from '@/lib/cn';

export const inputClasses =
  'block min-h-11 w-full rounded-lg border border-loam-500 bg-white px-3 py-2 text-base text-ink-950 ' +
  'placeholder:text-loam-600 aria-[invalid=true]:border-2 aria-[invalid=true]:border-brick-600 ' +
  'disabled:bg-loam-100 disabled:text-loam-700';

function FieldMessages({ hintId, hint, errorId, error }: { hintId: string; hint?: ReactNode; errorId: string; error?: string }) {
  return (
    <>
      {hint && (
        <p id={hintId} className="mt-1 text-sm text-loam-700">
          {hint}
        </p>
      )}
      {error && (
        <p id={errorId} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-brick-700">
          <ErrorMark />
          <span>{error}</span>
        </p>
      )}
    </>
  );
}

/** A small "!" in a triangle, so an error reads as one without its colour. */
export function ErrorMark({ className }: { className?: string }) {
  return (
    <svg viewBox="0 0 20 20" className={cn('mt-0.5 size-4 shrink-0', className)} aria-hidden="true">
      <path d="M10 2 19 18H1L10 2Z" fill="currentColor" />
      <path d="M10 8v4.5" stroke="white" strokeWidth="2" strokeLinecap="round" />
      <circle cx="10" cy="15.2" r="1.1" fill="white" />
    </svg>
  );
}

function describedBy(hint: unknown, hintId: string, error: unknown, errorId: string): string | undefined {
  const ids = [hint ? hintId : null, error ? errorId : null].filter(Boolean);
  return ids.length ? ids.join(' ') : undefined;
}

interface TextFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'children'> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  ref?: Ref<HTMLInputElement>;
}

export function TextField({ label, hint, error, id, className, ref, ...input }: TextFieldProps) {
  const autoId = useId();
  const inputId = id ?? autoId;
  const hintId = `${inputId}-hint`;
  const errorId = `${inputId}-error`;
  return (
    <div className={className}>
      <label htmlFor={inputId} className="mb-1 block font-semibold text-ink-900">
        {label}
      </label>
      <input
        ref={ref}
        id={inputId}
        className={inputClasses}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(hint, hintId, error, errorId)}
        {...input}
      />
      <FieldMessages hintId={hintId} hint={hint} errorId={errorId} error={error} />
    </div>
  );
}

interface SelectFieldProps extends Omit<SelectHTMLAttributes<HTMLSelectElement>, 'children'> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  options: ReadonlyArray<{ value: string; label: string }>;
  ref?: Ref<HTMLSelectElement>;
}

export function SelectField({ label, hint, error, id, className, options, ref, ...select }: SelectFieldProps) {
  const autoId = useId();
  const selectId = id ?? autoId;
  const hintId = `${selectId}-hint`;
  const errorId = `${selectId}-error`;
  return (
    <div className={className}>
      <label htmlFor={selectId} className="mb-1 block font-semibold text-ink-900">
        {label}
      </label>
      <select
        ref={ref}
        id={selectId}
        className={inputClasses}
        aria-invalid={error ? true : undefined}
        aria-describedby={describedBy(hint, hintId, error, errorId)}
        {...select}
      >
        {options.map((option) => (
          <option key={option.value} value={option.value}>
            {option.label}
          </option>
        ))}
      </select>
      <FieldMessages hintId={hintId} hint={hint} errorId={errorId} error={error} />
    </div>
  );
}

interface CheckboxGroupProps {
  legend: ReactNode;
  hint?: ReactNode;
  error?: string;
  options: ReadonlyArray<{ value: number; label: string; description?: string }>;
  value: number[];
  onChange: (next: number[]) => void;
  onBlur?: () => void;
  emptyText?: ReactNode;
  disabled?: boolean;
  /** Receives focus when the form reports an error on this group. */
  ref?: Ref<HTMLInputElement>;
}

/** A multi-select as a list of check boxes: every choice visible, each one a large target. */
export function CheckboxGroup({ legend, hint, error, options, value, onChange, onBlur, emptyText, disabled, ref }: CheckboxGroupProps) {
  const groupId = useId();
  const hintId = `${groupId}-hint`;
  const errorId = `${groupId}-error`;
  const toggle = (id: number, checked: boolean) =>
    onChange(checked ? [...value.filter((v) => v !== id), id] : value.filter((v) => v !== id));
  return (
    <fieldset aria-describedby={describedBy(hint, hintId, error, errorId)}>
      <legend className="mb-1 font-semibold text-ink-900">{legend}</legend>
      {options.length === 0 ? (
        <p className="text-loam-700">{emptyText ?? 'Nothing to choose from yet.'}</p>
      ) : (
        <ul
          className={cn(
            'max-h-64 divide-y divide-loam-200 overflow-y-auto rounded-lg border bg-white',
            error ? 'border-2 border-brick-600' : 'border-loam-500',
          )}
        >
          {options.map((option, index) => (
            <li key={option.value}>
              <label className="flex min-h-11 cursor-pointer items-center gap-3 px-3 py-2 hover:bg-loam-50">
                <input
                  ref={index === 0 ? ref : undefined}
                  type="checkbox"
                  className="size-5 accent-ink-700"
                  checked={value.includes(option.value)}
                  onChange={(event) => toggle(option.value, event.target.checked)}
                  onBlur={onBlur}
                  disabled={disabled}
                />
                <span>
                  <span className="text-ink-950">{option.label}</span>
                  {option.description && <span className="ml-2 text-sm text-loam-700">{option.description}</span>}
                </span>
              </label>
            </li>
          ))}
        </ul>
      )}
      <FieldMessages hintId={hintId} hint={hint} errorId={errorId} error={error} />
    </fieldset>
  );
}

/** A form-level message (the server's answer), announced when it appears. */
export function FormAlert({ children, tone = 'error' }: { children: ReactNode; tone?: 'error' | 'warning' }) {
  return (
    <div
      role="alert"
      className={cn(
        'flex items-start gap-2 rounded-lg border-l-4 px-4 py-3',
        tone === 'error' ? 'border-brick-600 bg-brick-50 text-brick-800' : 'border-amber-500 bg-amber-50 text-amber-800',
      )}
    >
      <ErrorMark className="mt-1" />
      <div>{children}</div>
    </div>
  );
}
