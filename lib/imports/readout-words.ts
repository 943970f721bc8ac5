// Which block readout a column header names (issue 20 point 2): the tonic one (first pulse, P1, resting
// holding potential) or the use-dependent one (n-th pulse of a train, P10, P20, depolarised holding
// potential). Words are Gatewell's own, from common lab usage; case and punctuation are ignored.
// Pure: the import wizard runs it in the browser too.

export type ReadoutWord = 'tonic' | 'use_dependent';

/** What a header says of its readout, and the header's other words (what it measures: block, a current). */
export interface HeaderReadout {
  readout: ReadoutWord | null;
  /** The header without its readout words, words joined by one space ("" when it held only those). */
  rest: string;
}

const TONIC_WORDS = new Set(['tonic', 'resting', 'rest', 'first']);
const USE_WORDS = new Set([
  'usedependent',
  'usedep',
  'phasic',
  'train',
  'trains',
  'depolarised',
  'depolarized',
  'depol',
  'inactivated',
  'ud',
  'nth',
  'last',
]);
const PULSE_WORDS = new Set(['pulse', 'pulses', 'sweep', 'step', 'stimulus']);

/** A header's words: camelCase split, lower case, split on anything but letters and digits. */
function words(header: string): string[] {
  return header
    .replace(/([a-z])([A-Z])/g, '$1 $2')
    .toLowerCase()
    .split(/[^a-z0-9]+/)
    .filter((w) => w !== '');
}

/** A pulse number written as P10, 10th, #10 (the # already dropped), or null. */
function pulseNumber(word: string): number | null {
  const match = /^(?:p|pulse)0*(\d{1,3})$/.exec(word) ?? /^0*(\d{1,3})(?:st|nd|rd|th)$/.exec(word);
  return match ? Number(match[1]) : null;
}

/**
 * The readout a header names and its other words: "P1 block" → tonic, "block"; "Use-dependent I (pA)" →
 * use_dependent, "i pa"; "Block" → null, "block". A pulse numbered 1 is tonic, a higher one use-dependent;
 * a bare number counts only beside a pulse word ("pulse 10", "10th pulse").
 */
export function readoutOfHeader(header: string): HeaderReadout {
  const all = words(header);
  const taken = new Set<number>();
  let readout: ReadoutWord | null = null;
  const mark = (index: number, kind: ReadoutWord) => {
    taken.add(index);
    // The use-dependent reading wins when a header names both ("first vs last" is not a readout anyway).
    if (readout !== 'use_dependent') readout = kind;
  };
  all.forEach((word, i) => {
    const next = all[i + 1];
    const previous = all[i - 1];
    if (TONIC_WORDS.has(word)) mark(i, 'tonic');
    else if (USE_WORDS.has(word)) mark(i, 'use_dependent');
    else if (word === 'use' && (next === 'dependent' || next === 'dep')) {
      mark(i, 'use_dependent');
      taken.add(i + 1);
    } else if (word === 'state' && next === 'dependent') {
      mark(i, 'use_dependent');
      taken.add(i + 1);
    } else {
      const numbered = pulseNumber(word);
      const bare = /^\d{1,3}$/.test(word) && (PULSE_WORDS.has(previous ?? '') || PULSE_WORDS.has(next ?? ''));
      const n = numbered ?? (bare ? Number(word) : null);
      if (n !== null && n >= 1) mark(i, n === 1 ? 'tonic' : 'use_dependent');
      else return;
    }
    // A pulse word beside a readout word belongs to it ("first pulse", "pulse 10").
    if (PULSE_WORDS.has(previous ?? '')) taken.add(i - 1);
    if (PULSE_WORDS.has(next ?? '')) taken.add(i + 1);
  });
  if (readout === null) return { readout: null, rest: all.join(' ') };
  return { readout, rest: all.filter((_, i) => !taken.has(i)).join(' ') };
}
