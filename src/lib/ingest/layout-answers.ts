/**
 * The layout review's answers: which questions of a detected layout still block reading the file,
 * and the profile to save once a person has answered them. Pure: the island (LayoutReview) draws it.
 */
import { answerColumnNumbers } from './column-numbers';
import type { LayoutProfile, LayoutQuestion } from './profile';

/** How the quoted numbers of a column that read two ways ('1,234') are written, by column index. */
export type NumberAnswers = Record<number, 'thousands' | 'decimal'>;

/** The column a 'columnNumbers.<n>' question is about. */
export const questionColumn = (q: LayoutQuestion): number => Number(q.field.split('.')[1]);

/** The questions about quoted numbers that read two ways: one choice per column. */
export function numberQuestions(profile: LayoutProfile): LayoutQuestion[] {
  return profile.questions.filter((q) => q.field.startsWith('columnNumbers.'));
}

/** What still stops the save: an unanswered number question, or a date order the file does not decide. */
export function blockingLeft(profile: LayoutProfile, answers: NumberAnswers): { numbersLeft: boolean; blockingLeft: boolean } {
  const numbersLeft = numberQuestions(profile).some((q) => q.blocking && !answers[questionColumn(q)]);
  return { numbersLeft, blockingLeft: (profile.time.kind === 'text' && profile.time.dateOrder === 'ambiguous') || numbersLeft };
}

/**
 * The profile with the person's answers in it: each answered column's number format, and without the
 * questions answered (the date order one once a date order is chosen; each number question answered).
 */
export function answeredProfile(profile: LayoutProfile, answers: NumberAnswers): LayoutProfile {
  let columnNumbers = profile.columnNumbers;
  for (const [col, a] of Object.entries(answers)) columnNumbers = answerColumnNumbers(columnNumbers, Number(col), a);
  return {
    ...profile,
    columnNumbers,
    questions: profile.questions.filter(
      (q) => (!q.blocking || q.field !== 'time.dateOrder' || profile.time.dateOrder === 'ambiguous') && !(q.field.startsWith('columnNumbers.') && answers[questionColumn(q)]),
    ),
  };
}
