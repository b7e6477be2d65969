import { useCallback, useState } from 'react';
import type { FieldValues, UseFormSetError } from 'react-hook-form';
import { applyServerErrors, formErrorMessage, isStale } from './forms';

export interface SaveError {
  message: string;
  /** Someone else saved first: offer a reload, never a silent overwrite. */
  stale: boolean;
}

/** Routes a failed save: field messages onto their fields, the rest (and 409s) into one alert. */
export function useSaveError<TForm extends FieldValues>(setError: UseFormSetError<TForm>, known: readonly string[]) {
  const [saveError, setSaveError] = useState<SaveError | null>(null);
  const handle = useCallback(
    (error: unknown) => {
      const unplaced = applyServerErrors(error, known, setError);
      const message = formErrorMessage(error, unplaced);
      setSaveError(message ? { message, stale: isStale(error) } : null);
    },
    [known, setError],
  );
  return { saveError, clearSaveError: () => setSaveError(null), handleSaveError: handle };
}
