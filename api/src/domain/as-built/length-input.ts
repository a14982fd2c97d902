import { METRES_PER_FOOT, METRES_PER_INCH } from './units.js';
import { unitFactor, type LengthScale, type LengthSystem } from '../format/length.js';

/**
 * The one reader of lengths typed by people (web forms on a phone, imports). It accepts what a tape
 * reads and a phone keyboard can type:
 *
 * - feet and inches: `18' 6"`, `18'6`, `18 6` (imperial ground lengths only), `18ft 6in`, `18 ft 6 in`,
 *   `18 feet 6 inches`;
 * - one unit: `18.5` (the field's unit), `18.5 ft`, `6"`, `6 in`, `4 1/4 in`, `4 1/4`, `4¼`, `1/2"`;
 * - metric: `2.5 m`, `15 cm`, `150 mm`, `1,5 m`, `1 m 20 cm`.
 *
 * and refuses, with a message naming the field: empty, negative, unreadable text, inches of 12 or more
 * after feet (`18' 13"`), a fraction that is not proper (`4 5/4`), or a zero denominator.
 */
export type LengthParse = { ok: true; metres: number } | { ok: false; message: string };

export type LengthParseOptions = {
  system: LengthSystem;
  scale: LengthScale;
  /** How the field is named on the screen, e.g. `Depth`; used at the start of every message. */
  field?: string;
};

const VULGAR: Record<string, string> = {
  '¼': '1/4',
  '½': '1/2',
  '¾': '3/4',
  '⅛': '1/8',
  '⅜': '3/8',
  '⅝': '5/8',
  '⅞': '7/8',
};

type Unit = 'ft' | 'in' | 'm' | 'cm' | 'mm';

const UNIT_WORDS: Record<string, Unit> = {
  "'": 'ft',
  ft: 'ft',
  foot: 'ft',
  feet: 'ft',
  '"': 'in',
  in: 'in',
  inch: 'in',
  inches: 'in',
  m: 'm',
  metre: 'm',
  metres: 'm',
  meter: 'm',
  meters: 'm',
  cm: 'cm',
  mm: 'mm',
};

const METRES_PER: Record<Unit, number> = { ft: METRES_PER_FOOT, in: METRES_PER_INCH, m: 1, cm: 0.01, mm: 0.001 };

// A quantity: a whole or decimal number, optionally followed by a proper fraction (`4 1/4`), or a
// fraction alone (`3/4`); then an optional unit. Sticky, so terms must follow each other.
const TERM =
  /\s*(?:(\d+)\/(\d+)|(\d+(?:[.,]\d+)?|[.,]\d+)(?:[\s-]+(\d+)\/(\d+))?)\s*(inches|inch|in|"|feet|foot|ft|'|metres|metre|meters|meter|mm|cm|m)?(?![a-z])/y;

type Term = { value: number; unit?: Unit; fractionError?: string };

function examples(system: LengthSystem, scale: LengthScale): string {
  if (system === 'metric') return scale === 'long' ? '12.5 m' : '15 cm';
  return scale === 'long' ? `40' 6" or 40.5` : '6 or 4 1/4';
}

/** Reads a typed length as metres (unrounded), or says what is wrong in words naming the field. */
export function parseLengthInput(input: string, options: LengthParseOptions): LengthParse {
  const { system, scale } = options;
  const field = options.field?.trim() || 'Length';
  const unreadable = (): LengthParse => ({
    ok: false,
    message: `${field}: cannot read "${input.trim()}" as a length; type e.g. ${examples(system, scale)}.`,
  });

  let text = input.trim().toLowerCase();
  if (text === '') return { ok: false, message: `${field}: enter a length, e.g. ${examples(system, scale)}.` };
  if (/^[-−–]/.test(text)) return { ok: false, message: `${field} cannot be negative.` };
  text = text
    .replace(/[′’‘]/g, "'")
    .replace(/[″“”]|''/g, '"')
    .replace(/(\d)?([¼½¾⅛⅜⅝⅞])/g, (_all, digit: string | undefined, glyph: string) => `${digit ?? ''} ${VULGAR[glyph]!}`.trimStart());

  const terms: Term[] = [];
  let index = 0;
  while (index < text.length) {
    if (/^\s*$/.test(text.slice(index))) break;
    TERM.lastIndex = index;
    const match = TERM.exec(text);
    if (!match || match[0].trim() === '') return unreadable();
    index = TERM.lastIndex;
    const [, num2, den2, number, num1, den1, unitWord] = match;
    let value: number;
    let fractionError: string | undefined;
    if (number !== undefined) {
      value = Number(number.replace(',', '.'));
      if (num1 !== undefined) {
        const n = Number(num1);
        const d = Number(den1);
        if (d === 0) fractionError = `${field}: a fraction cannot have 0 below the line.`;
        else if (n >= d) fractionError = `${field}: write ${num1}/${den1} as a whole number and a smaller fraction.`;
        else if (!Number.isInteger(value)) fractionError = `${field}: use either a decimal or a fraction, not both.`;
        else value += n / d;
      }
    } else {
      const d = Number(den2);
      if (d === 0) fractionError = `${field}: a fraction cannot have 0 below the line.`;
      value = d === 0 ? 0 : Number(num2) / d;
    }
    if (fractionError) return { ok: false, message: fractionError };
    terms.push({ value, unit: unitWord === undefined ? undefined : UNIT_WORDS[unitWord] });
  }
  if (terms.length === 0) return unreadable();

  let metres: number;
  if (terms.length === 1) {
    const [only] = terms as [Term];
    metres = only.value * (only.unit ? METRES_PER[only.unit] : unitFactor(system, scale));
  } else if (terms.length === 2 && isFeetInches(terms as [Term, Term], system, scale)) {
    const [feet, inches] = terms as [Term, Term];
    if (inches.value >= 12) {
      return {
        ok: false,
        message: `${field}: ${trim(inches.value)} in is a foot or more; write ${Math.floor(feet.value + inches.value / 12)}' ${trim(inches.value % 12)}" instead.`,
      };
    }
    metres = feet.value * METRES_PER_FOOT + inches.value * METRES_PER_INCH;
  } else if (terms.every((term) => term.unit === 'm' || term.unit === 'cm' || term.unit === 'mm')) {
    const units = terms.map((term) => term.unit);
    if (new Set(units).size !== units.length) return unreadable();
    metres = terms.reduce((sum, term) => sum + term.value * METRES_PER[term.unit!], 0);
  } else {
    return unreadable();
  }
  if (!Number.isFinite(metres)) return unreadable();
  return { ok: true, metres };
}

/**
 * Two terms read as feet then inches: `18' 6"`, `18' 6`, `18 6"`, `18ft 6in`; two bare numbers (`18 6`)
 * only in an imperial ground-length field, where a tape is read that way (in a depth field `3 4` is more
 * likely a slip than 3 ft 4 in, so it is refused).
 */
function isFeetInches([first, second]: [Term, Term], system: LengthSystem, scale: LengthScale): boolean {
  const feetOk = first.unit === 'ft' || first.unit === undefined;
  const inchesOk = second.unit === 'in' || second.unit === undefined;
  if (!feetOk || !inchesOk) return false;
  if (first.unit === undefined && second.unit === undefined) return system === 'imperial' && scale === 'long' && Number.isInteger(first.value);
  return true;
}

function trim(value: number): string {
  return String(Number(value.toFixed(3)));
}
