import { ZxcvbnFactory } from '@zxcvbn-ts/core';
import { adjacencyGraphs, dictionary } from '@zxcvbn-ts/language-common';

/**
 * Password strength by estimate of guesses (zxcvbn-ts with its common-password and common-word
 * dictionaries, keyboard patterns, repeats, sequences and dates). A password must reach score 3
 * ("safely unguessable": about 10^8 guesses or more, per the estimator's own scale) or it is refused
 * with the reason the estimator found.
 */
export const MIN_SCORE = 3;

/** Words of this product a password should not lean on. */
const OWN_WORDS = ['lossline', 'exergy', 'plant', 'steam', 'password'];

let factory: ZxcvbnFactory | undefined;
function estimator(): ZxcvbnFactory {
  factory ??= new ZxcvbnFactory({ dictionary: { ...dictionary }, graphs: adjacencyGraphs });
  return factory;
}

const WHY: Record<string, string> = {
  common: 'it is one of the most used passwords',
  commonNames: 'it is a common name',
  similarToCommon: 'it is a small change of a much-used password',
  straightRow: 'it is a row of keys on the keyboard',
  keyPattern: 'it is a short keyboard pattern',
  simpleRepeat: 'it repeats the same character',
  extendedRepeat: 'it repeats the same group of characters',
  sequences: 'it is a sequence like abc or 1234',
  recentYears: 'it leans on a recent year',
  dates: 'it leans on a date',
  topTen: 'it is one of the ten most used passwords',
  topHundred: 'it is one of the hundred most used passwords',
  namesByThemselves: 'it is a name on its own',
  userInputs: 'it leans on words of this product or your account',
  wordByItself: 'it is a single common word',
  pwned: 'it has appeared in leaked password lists',
};

/** Why a password is refused, in a sentence, or null when it is strong enough. */
export function passwordProblem(password: string, personal: string[] = []): string | null {
  const out = estimator().check(password, [...OWN_WORDS, ...personal.filter(Boolean)]);
  if (out.score >= MIN_SCORE) return null;
  const why = (out.feedback.warning && WHY[out.feedback.warning]) || 'it would be guessed too quickly';
  return `That password is too easy to guess: ${why}. Use a longer phrase of several unrelated words.`;
}
