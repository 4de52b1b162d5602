/**
 * Checks a layout against the values of one file before it is read. A saved layout is chosen by
 * the shape of the header, so a file of the same shape but another decimal mark or date order would
 * be read wrongly without a word: 1.5 rejected as text under a decimal comma, 10/03 stored as
 * 10 March instead of 3 October. Here the first part of the file is read under the layout and under
 * the other reading; when the other one fits the file's own values clearly better, the layout and
 * the file disagree and a person must answer (never guess).
 *
 *   parse rate: share of the non-blank value cells read as numbers.
 *   date order: under each order, rows whose time cannot be read, steps backwards, and jumps (a step
 *   more than 20 times the median step: a month where the sequence steps an hour).
 */
import { IngestError } from './errors';
import { fixed } from '../format';
import type { LayoutProfile, LayoutQuestion } from './profile';
import { createRowReader } from './reader';
import type { SampleSink } from './reader';

export interface LayoutDisagreement {
  question: LayoutQuestion;
  /** The field's value in the layout and the value that fits the file. */
  current: string;
  suggested: string;
  /** The figures behind the decision. */
  evidence: Record<string, number>;
}

interface SampleFigures {
  numbers: number;
  texts: number;
  unreadableTimes: number;
  backwards: number;
  jumps: number;
  rows: number;
}

/** Reads the sample under a profile and counts what fits; null when the profile cannot read it. */
function figures(text: string, profile: LayoutProfile, timeZone: string): SampleFigures | null {
  const times: number[] = [];
  let numbers = 0;
  let texts = 0;
  let unreadableTimes = 0;
  let lastTime = NaN;
  const noteTime = (t: number) => {
    if (t !== lastTime) times.push(t);
    lastTime = t;
  };
  const sink: SampleSink = {
    addTag() {},
    addRow(t, _values, status) {
      noteTime(t);
      for (let k = 0; k < status.length; k++) {
        if (status[k] === 0 || status[k] === 3 || status[k] === 4) numbers++;
        else if (status[k] === 2) texts++;
      }
    },
    addSample(_k, t, _v, st) {
      noteTime(t);
      if (st === 0 || st === 3 || st === 4) numbers++;
      else if (st === 2) texts++;
    },
  };
  try {
    const reader = createRowReader(profile, { timeZone, sink, onTimeError: () => unreadableTimes++ });
    reader.push(text);
    reader.end();
  } catch (err) {
    if (err instanceof IngestError) return null;
    throw err;
  }
  const steps: number[] = [];
  let backwards = 0;
  let previous = NaN;
  for (const t of times) {
    const d = t - previous; // NaN for the first time: neither backwards nor a step
    if (d < 0) backwards++;
    else if (d > 0) steps.push(d);
    previous = t;
  }
  const sorted = [...steps].sort((a, b) => a - b);
  const median = sorted[Math.floor(sorted.length / 2)] ?? 0;
  const jumps = median > 0 ? steps.filter((d) => d > 20 * median).length : 0;
  return { numbers, texts, unreadableTimes, backwards, jumps, rows: times.length + unreadableTimes };
}

const rate = (f: SampleFigures) => (f.numbers + f.texts === 0 ? 1 : f.numbers / (f.numbers + f.texts));
const timeTrouble = (f: SampleFigures) => 10 * f.unreadableTimes + f.backwards + f.jumps;

/**
 * Compares the layout's decimal mark and date order with the file's values.
 * @param sampleText decoded text from the start of the file
 * @param profile the layout about to be used (saved or sniffed)
 * @param options.complete true when the sample is the whole file (else its last, possibly cut, line is left out)
 * @returns the disagreement as a blocking question, or null when the layout fits (or cannot be judged)
 */
export function checkLayoutAgainstSample(
  sampleText: string,
  profile: LayoutProfile,
  options: { timeZone: string; complete: boolean },
): LayoutDisagreement | null {
  let text = sampleText;
  if (!options.complete) {
    const cut = Math.max(text.lastIndexOf('\n'), text.lastIndexOf('\r'));
    text = text.slice(0, cut + 1);
  }
  const here = figures(text, profile, options.timeZone);
  if (!here) return null;

  // Decimal mark: the other mark (without a thousands separator) reads clearly more numbers.
  const otherMark = profile.decimalMark === ',' ? '.' : ',';
  const alt = figures(text, { ...profile, decimalMark: otherMark, thousandsSeparator: '' } as LayoutProfile, options.timeZone);
  if (alt && here.numbers + here.texts >= 5 && rate(here) < 0.5 && rate(alt) >= 0.9) {
    return {
      current: profile.decimalMark,
      suggested: otherMark,
      evidence: { parseRate: rate(here), otherParseRate: rate(alt), cells: here.numbers + here.texts },
      question: {
        field: 'decimalMark',
        message:
          `The layout reads numbers with a decimal ${profile.decimalMark === ',' ? 'comma' : 'point'}, but then only ${fixed(100 * rate(here), 0)} % of this file's ` +
          `values are numbers; with a decimal ${otherMark === ',' ? 'comma' : 'point'} ${fixed(100 * rate(alt), 0)} % are. Which decimal mark does this file use?`,
        choices: ['.', ','],
        blocking: true,
      },
    };
  }

  // Date order: the other order gives the file's own sequence with fewer breaks.
  const t = profile.time;
  if (t.kind === 'text' && (t.dateOrder === 'dmy' || t.dateOrder === 'mdy')) {
    const other = t.dateOrder === 'dmy' ? 'mdy' : 'dmy';
    const swapped = figures(text, { ...profile, time: { ...t, dateOrder: other } } as LayoutProfile, options.timeZone);
    if (swapped && timeTrouble(here) > 0 && timeTrouble(swapped) < timeTrouble(here) && swapped.unreadableTimes <= here.unreadableTimes) {
      const name = (o: string) => (o === 'dmy' ? 'day first (dmy)' : 'month first (mdy)');
      return {
        current: t.dateOrder,
        suggested: other,
        evidence: {
          unreadableTimes: here.unreadableTimes,
          backwards: here.backwards,
          jumps: here.jumps,
          otherUnreadableTimes: swapped.unreadableTimes,
          otherBackwards: swapped.backwards,
          otherJumps: swapped.jumps,
        },
        question: {
          field: 'time.dateOrder',
          message:
            `The layout reads dates ${name(t.dateOrder)} (for example ${t.example}), but then this file's times break their own sequence ` +
            `(${here.unreadableTimes} unreadable, ${here.backwards} backwards, ${here.jumps} jumps); read ${name(other)} they break it ` +
            `${swapped.unreadableTimes + swapped.backwards + swapped.jumps} time(s). Which order does this file use?`,
          choices: ['dmy', 'mdy'],
          blocking: true,
        },
      };
    }
  }
  return null;
}
