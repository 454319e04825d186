// A refusal from the server, shown where it belongs: a 400's fields beside their inputs (under
// the form's names), anything else (a 409, offline) as one message for the whole form.
import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { formPathOf } from '@/domain/menu-admin-schemas';
import { ApiError } from '@/lib/http';

export function showServerErrors<T extends FieldValues>(err: unknown, setError: UseFormSetError<T>, fields: readonly string[]): string | null {
  if (err instanceof ApiError && err.status === 400 && err.details?.length) {
    let unplaced: string | null = null;
    for (const d of err.details) {
      const path = formPathOf(d.path.split('.').filter(Boolean)).join('.');
      if (fields.includes(path.split('.')[0])) setError(path as Path<T>, { type: 'server', message: d.message });
      else unplaced = `${d.path || 'The form'}: ${d.message}`;
    }
    return unplaced;
  }
  return err instanceof Error ? err.message : 'Something went wrong';
}
