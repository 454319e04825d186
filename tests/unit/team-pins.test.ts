// Which PINs and passwords the Team screen refuses, against published guidance.
import { describe, expect, it } from 'vitest';
import { newPersonBody, passwordSchema, pinSchema, pinWeakness, setPasswordBody } from '@/domain/team-schemas';

describe('pinWeakness', () => {
  it('refuses the PINs at the top of published lists of chosen PINs', () => {
    // DataGenetics, "PIN number analysis" (N. Berry, 2012), 3.4 million four-digit PINs: the most
    // chosen are 1234, 1111, 0000, 1212, 7777, … 4444, 2222 (from memory).
    for (const pin of ['1234', '1111', '0000', '1212', '7777', '4444', '2222']) expect(pinWeakness(pin), pin).not.toBeNull();
  });

  it('refuses repetitive and sequential digits at every allowed length', () => {
    // NIST SP 800-63B §5.1.1.2: check new secrets against a list including "repetitive or
    // sequential characters (e.g. 'aaaaaa', '1234abcd')" (from memory of the 2017 text).
    for (const pin of ['99999', '555555', '12345', '123456', '6789', '3456', '0123']) expect(pinWeakness(pin), pin).toMatch(/repeated|run/);
    for (const pin of ['4321', '54321', '987654', '3210']) expect(pinWeakness(pin), pin).toMatch(/run like 1234 or 4321/);
    for (const pin of ['2525', '121212', '123123', '909090', '456456']) expect(pinWeakness(pin), pin).toMatch(/repeated pattern/);
  });

  it('accepts PINs with none of those shapes', () => {
    // hand-checked: no single digit, no ±1 run, no repeated block
    for (const pin of ['8264', '5139', '4072', '1235', '2469', '13579', '730561', '112233', '9012']) expect(pinWeakness(pin), pin).toBeNull();
  });
});

describe('pinSchema', () => {
  it('takes 4 to 6 digits only, with one reason at a time', () => {
    expect(pinSchema.safeParse('4826').success).toBe(true);
    expect(pinSchema.safeParse('482615').success).toBe(true);
    for (const bad of ['482', '4826153', '48 26', '٤٨٢٦', '48a6', '']) {
      const r = pinSchema.safeParse(bad);
      expect(r.success, bad).toBe(false);
      expect(r.error!.issues.map((i) => i.message)).toEqual(['A PIN is 4 to 6 digits']);
    }
  });
});

describe('passwordSchema', () => {
  it('takes at least 10 characters and at most 72 UTF-8 bytes (the bcrypt limit)', () => {
    // OWASP Password Storage Cheat Sheet: bcrypt reads at most 72 bytes.
    expect(passwordSchema.safeParse('a'.repeat(9) + 'b').success).toBe(true);
    expect(passwordSchema.safeParse('abcdefghi').success).toBe(false);
    expect(passwordSchema.safeParse('ab'.repeat(36)).success).toBe(true); // 72 bytes
    expect(passwordSchema.safeParse('ab'.repeat(36) + 'c').success).toBe(false); // 73 bytes
    // RFC 3629: '€' (U+20AC) is 3 bytes in UTF-8 and 'é' (U+00E9) 2: 23 × 3 + 2 + 1 = 72 bytes in 25 characters
    expect(passwordSchema.safeParse('€'.repeat(23) + 'éa').success).toBe(true);
    expect(passwordSchema.safeParse('€'.repeat(23) + 'éab').success).toBe(false);
  });

  it('refuses one character repeated', () => {
    expect(passwordSchema.safeParse('aaaaaaaaaaaa').success).toBe(false);
  });

  it('must match its confirmation, reported on the confirm field', () => {
    const r = setPasswordBody.safeParse({ password: 'steamed oat milk', confirm: 'steamed oat mil' });
    expect(r.success).toBe(false);
    expect(r.error!.issues.map((i) => i.path.join('.'))).toEqual(['confirm']);
  });
});

describe('newPersonBody', () => {
  it('lower-cases and trims the sign-in name, and keeps its characters plain', () => {
    const r = newPersonBody.parse({ name: ' Ana ', username: ' Ana.L ', email: 'ana@example.com', role: 'barista' });
    expect(r).toEqual({ name: 'Ana', username: 'ana.l', email: 'ana@example.com', role: 'barista' });
    for (const username of ['a', 'ana l', '-ana', 'ana<script>', 'ána']) {
      expect(newPersonBody.safeParse({ name: 'A', username, email: 'a@example.com', role: 'cashier' }).success, username).toBe(false);
    }
  });
});
