// Reading stored rows the same way on both test legs: a JSON column is text on SQLite and already
// parsed on PostgreSQL; a boolean is 0/1 on SQLite and true/false on PostgreSQL; a count or sum is a
// number on SQLite and, being a bigint, text on PostgreSQL.

// eslint-disable-next-line @typescript-eslint/no-explicit-any
export const jsonOf = <T = any>(value: unknown): T => (typeof value === 'string' ? JSON.parse(value) : value) as T;

export const boolOf = (value: unknown): boolean => value === true || value === 1;

export const numberOf = (value: unknown): number => Number(value);
