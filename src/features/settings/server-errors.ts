// A 400 from the server names its fields ("timeZone", "extraShotCents"); put each message beside
// the form field it belongs to. What no field takes is shown with the section's status.
import type { FieldValues, Path, UseFormSetError } from 'react-hook-form';
import { ApiError } from '@/lib/http';

export function showServerErrors<F extends FieldValues>(error: unknown, setError: UseFormSetError<F>, fieldOf: Record<string, Path<F>>): string {
  if (!(error instanceof ApiError)) return 'Not saved: no answer from the server';
  const details = Array.isArray(error.details) ? error.details : [];
  const unplaced = details.filter((d) => {
    const field = fieldOf[d.path];
    if (field) setError(field, { type: 'server', message: d.message });
    return !field;
  });
  if (details.length > 0 && unplaced.length === 0) return 'Not saved: fix the fields marked below';
  return `Not saved: ${unplaced.map((d) => d.message).join('; ') || error.message}`;
}
