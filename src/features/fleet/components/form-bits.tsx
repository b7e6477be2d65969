import { useEffect, useId, type InputHTMLAttributes, type ReactNode, type Ref, type TextareaHTMLAttributes } from 'react';
import { Button } from '@/components/ui/button';
import { ErrorMark, FormAlert, inputClasses } from '@/components/ui/form-field';
import { cn } from '@/lib/cn';

/*
 * Small form pieces the fleet forms share: a text area and a check box with the same label, hint
 * and error look as the shell's TextField, the save-failure alert (with a reload offer on a stale
 * record), and the Save / Cancel row.
 */

interface TextAreaFieldProps extends Omit<TextareaHTMLAttributes<HTMLTextAreaElement>, 'children'> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  ref?: Ref<HTMLTextAreaElement>;
}

export function TextAreaField({ label, hint, error, id, className, ref, rows = 3, ...rest }: TextAreaFieldProps) {
  const autoId = useId();
  const fieldId = id ?? autoId;
  const described = [hint ? `${fieldId}-hint` : null, error ? `${fieldId}-error` : null].filter(Boolean).join(' ') || undefined;
  return (
    <div className={className}>
      <label htmlFor={fieldId} className="mb-1 block font-semibold text-ink-900">
        {label}
      </label>
      <textarea ref={ref} id={fieldId} rows={rows} className={inputClasses} aria-invalid={error ? true : undefined} aria-describedby={described} {...rest} />
      {hint && (
        <p id={`${fieldId}-hint`} className="mt-1 text-sm text-loam-700">
          {hint}
        </p>
      )}
      {error && (
        <p id={`${fieldId}-error`} className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-brick-700">
          <ErrorMark />
          <span>{error}</span>
        </p>
      )}
    </div>
  );
}

interface CheckboxFieldProps extends Omit<InputHTMLAttributes<HTMLInputElement>, 'type' | 'children'> {
  label: ReactNode;
  hint?: ReactNode;
  error?: string;
  ref?: Ref<HTMLInputElement>;
}

export function CheckboxField({ label, hint, error, id, className, ref, ...rest }: CheckboxFieldProps) {
  const autoId = useId();
  const fieldId = id ?? autoId;
  return (
    <div className={className}>
      <label htmlFor={fieldId} className="flex min-h-11 cursor-pointer items-center gap-3">
        <input ref={ref} id={fieldId} type="checkbox" className="size-5 shrink-0 accent-ink-700" aria-invalid={error ? true : undefined} {...rest} />
        <span className="font-semibold text-ink-900">{label}</span>
      </label>
      {hint && <p className="-mt-1 ml-8 text-sm text-loam-700">{hint}</p>}
      {error && (
        <p className="mt-1 flex items-start gap-1.5 text-sm font-semibold text-brick-700">
          <ErrorMark />
          <span>{error}</span>
        </p>
      )}
    </div>
  );
}

/**
 * Why a save failed. A stale record (someone else saved first) is never overwritten: the user is
 * offered the latest version instead, and makes their change again on top of it.
 */
export function SaveErrorAlert({ message, stale, onReload, reloading }: { message: string; stale?: boolean; onReload?: () => void; reloading?: boolean }) {
  return (
    <FormAlert tone={stale ? 'warning' : 'error'}>
      <p className="font-semibold">{message}</p>
      {stale && onReload && (
        <Button variant="secondary" className="mt-3" onClick={onReload} busy={reloading}>
          Reload the latest version
        </Button>
      )}
    </FormAlert>
  );
}

export function FormButtons({ busy, busyLabel, label, onCancel, disabled }: { busy: boolean; busyLabel: string; label: string; onCancel: () => void; disabled?: boolean }) {
  return (
    <div className="flex flex-wrap gap-3 border-t border-loam-200 pt-5">
      <Button type="submit" busy={busy} disabled={disabled}>
        {busy ? busyLabel : label}
      </Button>
      <Button variant="secondary" onClick={onCancel}>
        Cancel
      </Button>
    </div>
  );
}

/** A confirmation line that clears itself after a while; announced politely. */
export function Notice({ message, onDone, className }: { message: string | null; onDone: () => void; className?: string }) {
  useEffect(() => {
    if (!message) return;
    const timer = window.setTimeout(onDone, 8000);
    return () => window.clearTimeout(timer);
  }, [message, onDone]);
  return (
    <div role="status" className={cn('empty:hidden', className)}>
      {message && (
        <p className="rounded-lg border-l-4 border-seedling-500 bg-seedling-50 px-4 py-3 font-semibold text-seedling-800">
          <span aria-hidden="true">✓ </span>
          {message}
        </p>
      )}
    </div>
  );
}

/** Fieldset with a visible legend, for groups such as "Acres by crop" or a toolbar. */
export function FieldGroup({ legend, children, className }: { legend: ReactNode; children: ReactNode; className?: string }) {
  return (
    <fieldset className={cn('rounded-lg border border-loam-300 px-4 pt-2 pb-4', className)}>
      <legend className="px-1 font-semibold text-ink-900">{legend}</legend>
      {children}
    </fieldset>
  );
}
