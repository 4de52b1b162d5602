/**
 * The shape of one entry of the word catalogue (./index.ts): what a code or identifier of the engine,
 * the API or the database is called on a screen, in a mail, a PDF or a report for people.
 */

/**
 * What kind of number an identifier carries, so a screen can write it in the site's display units
 * (src/lib/units/display.ts). 'none' for codes and words that carry no number.
 */
export type WordQuantity =
  | 'power'
  | 'massFlow'
  | 'temperature'
  | 'temperatureDifference'
  | 'pressure'
  | 'specificEnergy'
  | 'specificEntropy'
  | 'entropyRate'
  | 'ratio'
  | 'percent'
  | 'count'
  | 'none';

export interface WordEntry {
  /** A short label, lower case unless it starts a sentence on its own ("spread too wide"). */
  readonly label: string;
  /** One sentence that says what it means and, where it helps, what to do. */
  readonly sentence: string;
  /** The kind of number it carries; 'none' for codes. */
  readonly quantity: WordQuantity;
}

/** An entry for a code (no number). */
export const code = (label: string, sentence: string): WordEntry => ({ label, sentence, quantity: 'none' });
/** An entry for an identifier that carries a number of a quantity. */
export const figure = (label: string, quantity: WordQuantity, sentence: string): WordEntry => ({ label, sentence, quantity });
