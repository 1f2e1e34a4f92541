/** Why a cell of a text dump is not a counter, in words a person can act on. */
export function whyNotACounter(raw: string): string {
  const text = raw.trim();
  const shown = text.length > 32 ? `${text.slice(0, 32)}…` : text;
  if (/^-\s*\d+(\.\d*)?([eE][+-]?\d+)?$/.test(text)) return `'${shown}' is negative; counters are whole numbers of 0 or more`;
  if (/^\+?\d*\.\d*([eE][+-]?\d+)?$|^\+?\d+[eE][+-]?\d+$/.test(text) && /\d/.test(text)) {
    return `'${shown}' is not a whole number; counters are whole numbers, written without a decimal point or exponent`;
  }
  return `'${shown}' is not a number; counters are whole numbers of 0 or more (remove any header line or labels)`;
}

/** 2^64 as a double: the largest counter a 64-bit cell holds rounds to it. */
export const COUNTER_CEILING = 2 ** 64;
export const TOO_BIG = 'is larger than 2^64 − 1, more than any 64-bit counter holds';
