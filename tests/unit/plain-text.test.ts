// Free text is one line of plain text (src/domain/text.ts): which characters are refused and
// which are kept, and a sweep over every request schema, so a text field added later without
// the shared rule is caught here. Sources: Unicode General_Category Cc/Zl/Zp/Cs (the Unicode
// Character Database), the bidi controls of UAX #9 (Unicode Bidirectional Algorithm), and
// CVE-2021-42574 ("Trojan Source") for why direction overrides are refused.
import { describe, expect, it } from 'vitest';
import { z } from 'zod';
import * as beanSchemas from '@/domain/beans-schemas';
import * as menuAdminSchemas from '@/domain/menu-admin-schemas';
import * as schemas from '@/domain/schemas';
import * as settingsSchemas from '@/domain/settings-schemas';
import * as teamSchemas from '@/domain/team-schemas';
import { PLAIN_TEXT_MESSAGE, isPlainText, plainText } from '@/domain/text';

const hex = (s: string) => [...s].map((c) => `U+${c.codePointAt(0)!.toString(16).toUpperCase().padStart(4, '0')}`).join(' ');

/** One of each kind the rule refuses (the ranges as UAX #9 and the UCD give them). */
const REFUSED = [
  '\u0000',
  '\u0007',
  '\t',
  '\n',
  '\u000b',
  '\r',
  '\u001b',
  '\u001f', // C0
  '\u007f', // DEL
  '\u0080',
  '\u0085',
  '\u009b',
  '\u009f', // C1 (U+0085 NEL, U+009B CSI)
  '\u2028',
  '\u2029', // line and paragraph separators
  '\u202a',
  '\u202b',
  '\u202c',
  '\u202d',
  '\u202e', // LRE RLE PDF LRO RLO
  '\u2066',
  '\u2067',
  '\u2068',
  '\u2069', // LRI RLI FSI PDI
  '\ud800',
  '\udfff', // unpaired surrogates
];

/** Text people really type, kept: accents, other scripts, emoji with joiners, the bidi marks. */
const KEPT = [
  'Zoë Ćirić',
  'Ångström café',
  '山田 花子',
  'Ольга',
  'يوسف',
  'נועה',
  'Ana (oat) — “extra hot”',
  '👩🏽‍🍳 barista',
  '🇮🇪',
  'O\u2019Brien',
  'Latte \u200F(RTL mark)',
  'x\u200Ey',
  'a\u061Cb',
  'no\u00A0break',
  '½ sugar',
];

describe('isPlainText', () => {
  it.each(REFUSED.map((c) => [hex(c), c]))('refuses %s anywhere in the text', (_name, c) => {
    for (const text of [c, `a${c}`, `${c}a`, `Oat ${c} milk`]) expect(isPlainText(text), hex(text)).toBe(false);
  });

  it.each(KEPT)('keeps %s', (text) => {
    expect(isPlainText(text)).toBe(true);
  });
});

describe('plainText()', () => {
  const field = plainText().min(1, 'Enter a name').max(10);

  it('trims spaces but refuses a line break at either end (checked before the trim)', () => {
    expect(field.parse('  Ana  ')).toBe('Ana');
    for (const v of ['Ana\n', '\r\nAna', 'Ana\u2028']) {
      const r = field.safeParse(v);
      expect(r.success, hex(v)).toBe(false);
      expect(r.error?.issues[0].message).toBe(PLAIN_TEXT_MESSAGE);
    }
  });

  it('keeps the other rules of the field', () => {
    expect(field.safeParse('   ').error?.issues[0].message).toBe('Enter a name');
    expect(field.safeParse('x'.repeat(11)).success).toBe(false);
  });
});

// ---------------------------------------------------------------- the sweep

/** Not text to show: secrets, typed as they are (fields, and the schemas of them). */
const NOT_TEXT = new Set(['password', 'confirm', 'pin', 'passwordSchema', 'pinSchema']);
/** What a text field of ours takes; a field that accepts none of these is not free text. */
const SAMPLES = ['Plain text', 'milk', 'ada@example.com', '2.4', 'America/New_York', 'en-US', 'USD', 'OA', 'nell', '12 oz', 'Regular'];

interface Leaf {
  path: string;
  schema: z.ZodType;
}

/** The leaves of a request schema, through objects, arrays, wrappers, unions and pipes. */
function leaves(schema: z.ZodType, path: string): Leaf[] {
  const def = (schema as unknown as { def: Record<string, unknown> }).def;
  if (schema instanceof z.ZodObject) return Object.entries(schema.shape as Record<string, z.ZodType>).flatMap(([k, v]) => leaves(v, path ? `${path}.${k}` : k));
  if (schema instanceof z.ZodArray) return leaves(schema.element as z.ZodType, `${path}.0`);
  if (schema instanceof z.ZodOptional || schema instanceof z.ZodNullable || schema instanceof z.ZodDefault) return leaves(def.innerType as z.ZodType, path);
  if (schema instanceof z.ZodUnion) return (def.options as z.ZodType[]).flatMap((o) => leaves(o, path));
  if (schema instanceof z.ZodPipe) return leaves(def.in as z.ZodType, path);
  if (schema instanceof z.ZodRecord) return [...leaves(def.keyType as z.ZodType, `${path}.<key>`), ...leaves(def.valueType as z.ZodType, `${path}.<value>`)];
  return [{ path, schema }];
}

const modules = { schemas, menuAdminSchemas, teamSchemas, settingsSchemas, beanSchemas };
/** Request bodies and queries (the *Form schemas are the screens' raw inputs, checked as bodies). */
const requestSchemas = Object.entries(modules).flatMap(([module, m]) =>
  Object.entries(m)
    .filter(([name, v]) => v instanceof z.ZodType && !name.endsWith('Form') && !NOT_TEXT.has(name))
    .map(([name, v]) => [`${module}.${name}`, v as z.ZodType] as const),
);

describe('every text field of every request schema', () => {
  const textLeaves = requestSchemas.flatMap(([name, schema]) =>
    leaves(schema, '')
      .filter((l) => !NOT_TEXT.has(l.path.split('.').at(-1)!))
      .flatMap((l) => {
        const sample = SAMPLES.find((s) => l.schema.safeParse(s).success);
        return sample === undefined ? [] : [{ name: `${name} ${l.path || '(value)'}`, schema: l.schema, sample }];
      }),
  );

  it('finds the text fields (names, notes, reasons, searches, e-mail, settings)', () => {
    const names = textLeaves.map((l) => l.name);
    expect(names).toEqual(
      expect.arrayContaining([
        'schemas.createOrderBody customerName',
        'schemas.orderLineInput note',
        'schemas.refundBody reason',
        'schemas.ordersQuery q',
        'menuAdminSchemas.extraBody name',
        'menuAdminSchemas.sizeInput cup',
        'settingsSchemas.settingsBody receiptFooter',
        'teamSchemas.newPersonBody name',
        'beanSchemas.beanLotBody notes',
        'beanSchemas.dialInShotBody tasteNote',
      ]),
    );
  });

  it('refuses each forbidden character inside, before and after the value', () => {
    const accepted: string[] = [];
    for (const leaf of textLeaves) {
      for (const c of REFUSED) {
        for (const v of [`${c}${leaf.sample}`, `${leaf.sample.slice(0, 1)}${c}${leaf.sample.slice(1)}`, `${leaf.sample}${c}`]) {
          if (leaf.schema.safeParse(v).success) accepted.push(`${leaf.name}: ${hex(c)}`);
        }
      }
    }
    expect([...new Set(accepted)]).toEqual([]);
  });
});
