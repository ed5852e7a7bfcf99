/**
 * FITS header parsing (FITS Standard 4.0, IAU FITS Working Group 2016, sections 3-4): a header is a
 * sequence of 2880-byte blocks of 80-character ASCII cards, ending with the END card. A value card has
 * `= ` in columns 9-10; strings are in single quotes with `''` for a quote; logicals are T or F; numbers
 * may use a D exponent. Comments follow a `/`.
 */
import { InputError } from '../core/errors.js';
import type { RandomAccess } from './randomAccess.js';

export const BLOCK = 2880;
const CARD = 80;

export type FitsValue = string | number | boolean;

export interface FitsCard {
  keyword: string;
  value?: FitsValue;
  /** The value as written (for exact int64 TZERO/TNULL). */
  raw?: string;
  /** 1-based card number in the header. */
  index: number;
}

export interface FitsHeader {
  cards: FitsCard[];
  /** Byte offset of the header and of the data that follows it. */
  start: number;
  dataStart: number;
  get(keyword: string): FitsCard | undefined;
}

/** Read the header starting at byte `start` (a block boundary). */
export function readFitsHeader(file: RandomAccess, start: number, hdu: number, path: string): FitsHeader {
  const cards: FitsCard[] = [];
  let offset = start;
  for (;;) {
    const block = file.read(offset, BLOCK);
    if (block.length < BLOCK) {
      throw new InputError(`the FITS file is truncated: the header of HDU ${hdu} ends before its END card`, {
        where: { file: path, hdu },
        found: `${file.size} bytes; the header block at byte ${offset} needs ${BLOCK}`,
        expected: 'complete 2880-byte header blocks ending with END',
        hint: 'the file was cut short: download or copy it again',
      });
    }
    offset += BLOCK;
    for (let c = 0; c < BLOCK; c += CARD) {
      const text = block.toString('latin1', c, c + CARD);
      const keyword = text.slice(0, 8).trim();
      if (keyword === 'END') return makeHeader(cards, start, offset);
      if (/[^\x20-\x7e]/.test(text)) {
        throw new InputError(`HDU ${hdu}, header card ${cards.length + 1} holds bytes that are not printable ASCII`, {
          where: { file: path, hdu },
          found: JSON.stringify(text.slice(0, 20)),
          expected: 'FITS header cards of printable ASCII (FITS Standard 4.0, section 4.1)',
          hint: 'this is not a FITS file, or it is damaged',
        });
      }
      const card: FitsCard = { keyword, index: cards.length + 1 };
      if (text.slice(8, 10) === '= ') parseValue(text.slice(10), card);
      cards.push(card);
    }
  }
}

function makeHeader(cards: FitsCard[], start: number, dataStart: number): FitsHeader {
  const byKey = new Map<string, FitsCard>();
  for (const c of cards) if (!byKey.has(c.keyword)) byKey.set(c.keyword, c);
  return { cards, start, dataStart, get: (k) => byKey.get(k) };
}

function parseValue(field: string, card: FitsCard): void {
  const s = field.trimStart();
  if (s.startsWith("'")) {
    let out = '';
    let i = 1;
    for (; i < s.length; i++) {
      if (s[i] === "'") {
        if (s[i + 1] === "'") {
          out += "'";
          i++;
          continue;
        }
        break;
      }
      out += s[i];
    }
    // Trailing blanks in a string value are not significant (section 4.2.1).
    card.value = out.replace(/\s+$/, '');
    card.raw = card.value;
    return;
  }
  const slash = s.indexOf('/');
  const token = (slash >= 0 ? s.slice(0, slash) : s).trim();
  card.raw = token;
  if (token === 'T') card.value = true;
  else if (token === 'F') card.value = false;
  else if (/^[+-]?\d+$/.test(token)) card.value = Number(token);
  else if (/^[+-]?(\d+\.?\d*|\.\d+)([EeDd][+-]?\d+)?$/.test(token)) card.value = Number(token.replace(/[Dd]/, 'E'));
}

/** An integer keyword, with a located error when it is missing or not an integer. */
export function intKeyword(h: FitsHeader, keyword: string, hdu: number, path: string, check?: (v: number) => boolean, expected?: string): number {
  const card = h.get(keyword);
  const v = card?.value;
  if (typeof v !== 'number' || !Number.isInteger(v) || (check && !check(v))) {
    throw new InputError(
      card === undefined ? `HDU ${hdu} has no ${keyword} keyword` : `HDU ${hdu}, header card ${card.index}: ${keyword} = ${card.raw ?? '(no value)'} is not valid`,
      {
        where: { file: path, hdu },
        found: card?.raw,
        expected: expected ?? `an integer ${keyword} (FITS Standard 4.0)`,
        hint: 'the header is damaged or was written by a non-conforming tool; rewrite the file with a FITS library',
      },
    );
  }
  return v;
}
