import fc from 'fast-check';

/**
 * What a body field accepts, as far as the bad-input suite needs to know to make a value it must
 * refuse. Only the rules stated here are used: a value generated for a spec breaks at least one.
 */
export type FieldSpec =
  | {
      type: 'string';
      max: number;
      /** At least this many characters after trimming (1 = required text). */
      min?: number;
      nullable?: boolean;
      /** A format the value must have; values breaking it are generated too. */
      format?: 'email' | 'date' | 'datetime' | 'uuid' | 'phone' | 'svgPath' | 'clientUploadId';
    }
  | { type: 'number'; min: number; max: number; isInteger?: boolean; isMinExclusive?: boolean; nullable?: boolean }
  | { type: 'enum'; values: readonly string[]; nullable?: boolean }
  | { type: 'boolean'; nullable?: boolean }
  | { type: 'object'; nullable?: boolean }
  | { type: 'array'; max?: number; nullable?: boolean };

/** A value that is not an object, array, string, number or boolean as the spec wants. */
const otherTypes = (spec: FieldSpec): fc.Arbitrary<unknown> => {
  const all: Record<string, fc.Arbitrary<unknown>> = {
    string: fc.constantFrom('12', 'true', '', '[object Object]'),
    number: fc.oneof(fc.integer({ min: -5, max: 5 }), fc.constantFrom(0.5, -1e308)),
    boolean: fc.boolean(),
    object: fc.constantFrom({}, { value: 1 }),
    array: fc.constantFrom([], ['x'], [[]]),
  };
  const own = spec.type === 'enum' ? 'string' : spec.type;
  const others = Object.entries(all)
    .filter(([type]) => type !== own)
    // A number where a date or enum string is wanted is wrong; a string "12" where a number is wanted is wrong too.
    .map(([, arb]) => arb);
  return fc.oneof(...others, ...(spec.nullable ? [] : [fc.constant(null)]));
};

/** Strings no text column can hold: NUL, unpaired UTF-16 surrogates. */
export const unstorableString = (): fc.Arbitrary<string> =>
  fc
    .tuple(fc.string({ maxLength: 5 }), fc.constantFrom('\u0000', '\ud800', '\udfff', 'a\udc00b', '\ud83d'), fc.string({ maxLength: 5 }))
    .map(([a, bad, b]) => `L${a}${bad}${b}`);

const MEGABYTE = 1024 * 1024;

/** Out-of-range and malformed values for a string field of `spec`. */
function invalidStrings(spec: Extract<FieldSpec, { type: 'string' }>): fc.Arbitrary<unknown> {
  const options: fc.Arbitrary<unknown>[] = [
    // Just over the maximum, and far over it (1 MB).
    fc.constant('x'.repeat(spec.max + 1)),
    fc.constant('y'.repeat(MEGABYTE)),
    unstorableString(),
  ];
  if ((spec.min ?? 0) >= 1) options.push(fc.constantFrom('', '   ', '\t\n'));
  switch (spec.format) {
    case 'email':
      options.push(fc.constantFrom('not-an-email', '@nowhere.example', 'a@', 'two@@signs.example', 'a b@space.example'));
      break;
    case 'date':
      // Well-shaped but impossible dates must be refused too, not passed on to the database.
      options.push(fc.constantFrom('2026-02-30', '2026-13-01', '0000-00-00', '9999-99-99', '2026-5-4', '14/05/2026', 'yesterday'));
      break;
    case 'datetime':
      options.push(fc.constantFrom('2026-02-30T10:00:00Z', 'not a time', '2026-05-14', '2026-05-14T25:61:00Z', '1e400'));
      break;
    case 'uuid':
      options.push(fc.constantFrom('not-a-uuid', '1 OR 1=1', '00000000-0000-0000-0000-00000000000g', `${'a'.repeat(36)}`, '{}'));
      break;
    case 'phone':
      options.push(fc.constantFrom('call me', '555<script>', '+1 (555) 0100; drop table'));
      break;
    case 'svgPath':
      options.push(fc.constantFrom('<path d="M0 0"/>', 'M 0 0 javascript:alert(1)', 'url(#x)', 'M', '   '));
      break;
    case 'clientUploadId':
      options.push(fc.constantFrom('has space', 'slash/slash', 'x'.repeat(101), 'ü'));
      break;
  }
  return fc.oneof(...options);
}

/** Out-of-range and malformed values for a number field: absurd measurements, fractions for integers. */
function invalidNumbers(spec: Extract<FieldSpec, { type: 'number' }>): fc.Arbitrary<unknown> {
  const options: fc.Arbitrary<unknown>[] = [
    fc.constant(spec.isMinExclusive ? spec.min : spec.min - (spec.isInteger ? 1 : Math.max(1e-3, Math.abs(spec.min) * 1e-6))),
    fc.constant(spec.max + (spec.isInteger ? 1 : Math.max(1e-3, Math.abs(spec.max) * 1e-6))),
    // Absurd measurements: a depth of -1 m, gauge 99, a billion metres …, where the spec refuses them.
    fc.constantFrom(...[-1, 99, 1e9, -1e9, 1e300, -1e300, Number.MAX_SAFE_INTEGER + 2].filter((n) => n < spec.min || n > spec.max)),
    fc.double({ noNaN: true, noDefaultInfinity: true }).filter((n) => n < spec.min || n > spec.max || (spec.isMinExclusive === true && n === spec.min)),
  ];
  if (spec.isInteger) options.push(fc.constantFrom(spec.min + 0.5, 1.000001));
  return fc.oneof(...options);
}

/** A JSON value that breaks `spec` (wrong type, out of range, malformed, unstorable). */
export function invalidValueFor(spec: FieldSpec): fc.Arbitrary<unknown> {
  const byRule: fc.Arbitrary<unknown>[] = [otherTypes(spec)];
  switch (spec.type) {
    case 'string':
      byRule.push(invalidStrings(spec));
      break;
    case 'number':
      byRule.push(invalidNumbers(spec));
      break;
    case 'enum':
      byRule.push(fc.constantFrom('bogus', '', ' ', 'DROP', '__proto__'), fc.constantFrom(...spec.values).map((v) => `${v.toUpperCase()} `));
      break;
    case 'boolean':
      byRule.push(fc.constantFrom('true', 'false', 'yes', 0, 1));
      break;
    case 'array':
      if (spec.max !== undefined) byRule.push(fc.constant(Array.from({ length: spec.max + 1 }, () => 'x')));
      break;
    case 'object':
      break;
  }
  return fc.oneof(...byRule);
}

/**
 * Text that is awkward but allowed: right-to-left overrides, zero-width characters, combining marks,
 * astral-plane characters, quotes, markup and SQL-looking text. Wrapped in letters so that trimming never
 * changes it: the API must store it and give back exactly these characters.
 */
export function hostileButValidText(maxLength: number): fc.Arbitrary<string> {
  const pieces = fc.constantFrom(
    '\u202e',
    '\u202d',
    '\u200b',
    '\u200d',
    '\ufeff',
    'e\u0301',
    '\u{1F50A}',
    '\u{1D11E}',
    '𠜎',
    'ﷺ',
    'ا',
    '"',
    "'",
    '\\',
    '<script>alert(1)</script>',
    "'; drop table jobs; --",
    '${process.env}',
    '{{constructor}}',
    '%s%n',
    '&amp;',
    ' ',
  );
  return fc
    .array(pieces, { minLength: 1, maxLength: 8 })
    .map((parts) => `A${parts.join('')}Z`)
    .filter((text) => text.length <= maxLength);
}

/** Raw JSON bodies that are not what a JSON API may accept, each with why it is wrong. */
export const MALFORMED_JSON_BODIES: { name: string; text: string }[] = [
  { name: 'truncated', text: '{"a":' },
  { name: 'NaN literal', text: '{"a": NaN}' },
  { name: 'Infinity literal', text: '{"a": Infinity}' },
  { name: 'single quotes', text: "{'a': 1}" },
  { name: 'trailing comma', text: '{"a": 1,}' },
  { name: 'comment', text: '{"a": 1 /* note */}' },
  { name: 'bare word', text: 'undefined' },
];

/** Bodies that are valid JSON but not a JSON object. */
export const NON_OBJECT_JSON_BODIES: { name: string; text: string }[] = [
  { name: 'array', text: '[]' },
  { name: 'array of objects', text: '[{"a":1}]' },
  { name: 'string', text: '"hello"' },
  { name: 'number', text: '42' },
  { name: 'null', text: 'null' },
  { name: 'true', text: 'true' },
];

/** `depth` levels of nested arrays around `inner`, as JSON text (built without recursion). */
export function deeplyNestedJson(depth: number, inner = '1'): string {
  return `${'['.repeat(depth)}${inner}${']'.repeat(depth)}`;
}

/** Path-parameter values that are not ids at all. */
export const NOT_AN_ID = ['not-a-uuid', '1', "1' or '1'='1", '%00', '..%2F..%2Fetc', 'a'.repeat(2000), '00000000-0000-0000-0000-00000000000g', '%E2%80%AE'];
