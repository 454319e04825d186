// Small helpers for reading rows the same way from SQLite and PostgreSQL.

/** JSON columns come back as text from SQLite and already parsed from PostgreSQL. */
export function json<T>(value: unknown, fallback: T): T {
  if (value === null || value === undefined) return fallback;
  if (typeof value !== 'string') return value as T;
  try {
    return JSON.parse(value) as T;
  } catch {
    return fallback;
  }
}

export const bool = (value: unknown) => value === true || value === 1;

// the unique-violation test lives with the other dialect differences
export { isUniqueViolation } from './dialect';
