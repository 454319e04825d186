// Free text (names, notes, reasons, searches, CSV name cells) is one line of plain text. Refused,
// never stripped, so what is stored is what was typed:
// - C0 controls (U+0000–U+001F, with tab, LF and CR), DEL and the C1 controls (U+0080–U+009F,
//   with NEL): a line break could forge a line on a plain-text receipt, cup label or CSV ("Total
//   $0.00"); U+0000 ends a string in C code that reads the database; the rest mean nothing on paper.
// - The line and paragraph separators U+2028/U+2029: line breaks too.
// - The bidirectional embeddings and overrides U+202A–U+202E and isolates U+2066–U+2069 (Unicode
//   UAX #9): they reorder how the rest of a line is shown, so "Latte ‮00.5$" prints as something
//   else than what is stored ("Trojan Source", CVE-2021-42574). The marks U+200E/U+200F/U+061C
//   stay allowed: mixed right-to-left and left-to-right names need them and they reorder nothing
//   beyond themselves.
// - A surrogate without its partner: not a character at all, and not storable as UTF-8.
import { z } from 'zod';

const FORBIDDEN = /[\p{Cc}\p{Cs}\p{Zl}\p{Zp}\u202A-\u202E\u2066-\u2069]/u;

export const PLAIN_TEXT_MESSAGE = 'Use one line of plain text (no line breaks, control characters or direction overrides)';

export const isPlainText = (text: string): boolean => !FORBIDDEN.test(text);

/**
 * A free-text field: checked before it is trimmed (a trailing line break is refused too), then
 * trimmed. Chain .min/.max/.optional as with any string. `error` is the message for a non-string.
 */
export const plainText = (error?: string) => z.string(error).refine(isPlainText, PLAIN_TEXT_MESSAGE).trim();
