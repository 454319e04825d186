// The Team screen's requests and answers (staff accounts, invitation links, PINs), written once
// and used by the forms and the server routes; and the pure checks behind them.
import { z } from 'zod';
import { ROLES, type Role } from './roles';
import { plainText } from './text';

export const PASSWORD_MIN_CHARS = 10;
/** bcrypt reads only the first 72 bytes (OWASP Password Storage Cheat Sheet). */
export const PASSWORD_MAX_BYTES = 72;
export const PIN_MIN_DIGITS = 4;
export const PIN_MAX_DIGITS = 6;
/** Wrong PINs for one person before their PIN locks, and for how long. */
export const PIN_TRIES = 5;
export const PIN_LOCK_MINUTES = 5;
/** How long an invitation or reset link works. */
export const LINK_HOURS = 72;

const utf8Bytes = (s: string) => new TextEncoder().encode(s).length;

/**
 * Why a PIN is too easy to guess, or null. Refused: one digit repeated (1111), a run up or down
 * (1234, 9876), and a short pattern repeated (1212, 123123) — the shapes that top every list of
 * chosen PINs.
 */
export function pinWeakness(pin: string): string | null {
  const d = [...pin].map(Number);
  if (d.every((x) => x === d[0])) return 'A PIN of one digit repeated is the first thing anyone tries';
  const steps = d.slice(1).map((x, i) => x - d[i]);
  if (steps.every((s) => s === 1) || steps.every((s) => s === -1)) return 'A run like 1234 or 4321 is too easy to guess';
  for (let period = 2; period <= d.length / 2; period++) {
    if (d.length % period === 0 && pin === pin.slice(0, period).repeat(d.length / period)) {
      return 'A repeated pattern like 1212 is too easy to guess';
    }
  }
  return null;
}

const PIN_FORMAT = new RegExp(`^\\d{${PIN_MIN_DIGITS},${PIN_MAX_DIGITS}}$`);

export const pinSchema = z
  .string()
  .regex(PIN_FORMAT, `A PIN is ${PIN_MIN_DIGITS} to ${PIN_MAX_DIGITS} digits`)
  .superRefine((pin, ctx) => {
    const weak = PIN_FORMAT.test(pin) ? pinWeakness(pin) : null; // one reason at a time
    if (weak) ctx.addIssue({ code: 'custom', message: weak });
  });

export const passwordSchema = z
  .string()
  .min(PASSWORD_MIN_CHARS, `At least ${PASSWORD_MIN_CHARS} characters`)
  .refine((p) => utf8Bytes(p) <= PASSWORD_MAX_BYTES, `Too long: at most about ${PASSWORD_MAX_BYTES} characters (accented letters count double)`)
  .refine((p) => new Set(p).size > 1, 'Not one character repeated');

export const roleSchema = z.enum(ROLES);
const personName = plainText().min(1, 'Enter a name').max(80);
const email = z.email('Not an e-mail address').max(254);

export const newPersonBody = z.object({
  name: personName,
  username: plainText()
    .toLowerCase()
    .min(2, 'At least 2 characters')
    .max(64)
    .regex(/^[a-z0-9][a-z0-9._-]*$/, 'Letters, digits, dot, dash or underscore, starting with a letter or digit'),
  email,
  role: roleSchema,
});
export type NewPersonBody = z.infer<typeof newPersonBody>;

export const personPatchBody = z
  .object({ name: personName.optional(), email: email.nullable().optional(), role: roleSchema.optional(), active: z.boolean().optional() })
  .strict()
  .refine((b) => Object.keys(b).length > 0, 'Say what to change');
export type PersonPatchBody = z.infer<typeof personPatchBody>;

export const LINK_PURPOSES = ['invite', 'reset'] as const;
export type LinkPurpose = (typeof LINK_PURPOSES)[number];
export const sendLinkBody = z.object({ purpose: z.enum(LINK_PURPOSES) });

/** The owner sets or clears someone's PIN. */
export const pinBody = z.object({ pin: pinSchema.nullable() });
/** A person sets or clears their own PIN, proving it is them with their password. */
export const ownPinBody = z.object({ password: z.string().min(1, 'Enter your password').max(200), pin: pinSchema.nullable() });
export type OwnPinBody = z.infer<typeof ownPinBody>;

export const switchBody = z.object({
  userId: z.number().int().positive(),
  pin: z.string().regex(/^\d{1,12}$/, 'Digits only'),
});
export type SwitchBody = z.infer<typeof switchBody>;

/** An owner chooses which café of their group this session works on. */
export const chooseCafeBody = z.object({ locationId: z.number().int().positive() });
export type ChooseCafeBody = z.infer<typeof chooseCafeBody>;

/** 32 random bytes, base64url without padding. */
export const tokenParam = z.object({ token: z.string().regex(/^[A-Za-z0-9_-]{43}$/, 'Not a link token') });

export const setPasswordBody = z
  .object({ password: passwordSchema, confirm: z.string().max(200) })
  .refine((b) => b.password === b.confirm, { path: ['confirm'], message: 'The two passwords differ' });
export type SetPasswordBody = z.infer<typeof setPasswordBody>;

// ------------------------------------------------------------------ answers

export interface TeamLink {
  purpose: LinkPurpose;
  createdAt: string;
  /** Null when the mail server did not take the mail. */
  sentAt: string | null;
  expiresAt: string;
  expired: boolean;
}

export interface TeamMember {
  id: number;
  name: string;
  username: string;
  role: Role;
  email: string | null;
  active: boolean;
  /** Invited, no password set yet. */
  awaitingPassword: boolean;
  hasPin: boolean;
  /** The newest link not yet used or voided. */
  link: TeamLink | null;
}

/** GET /api/team. */
export interface TeamView {
  members: TeamMember[];
  /** The signed-in owner, so the screen can say "you". */
  youId: number;
  timeZone: string;
  locale: string;
}

/** GET /api/welcome/:token: who the link is for, and nothing else. */
export interface WelcomeView {
  name: string;
  username: string;
  purpose: LinkPurpose;
  locationName: string;
}

/** GET /api/switch/people: who can take over this terminal by PIN. */
export interface SwitchPerson {
  id: number;
  name: string;
  role: Role;
}
