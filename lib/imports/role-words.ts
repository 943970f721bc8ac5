// The file's own words for a well's role, and Gatewell's guess of what each means.
import type { WellRole } from '@/lib/domain/well-roles';
import { normaliseLabel } from './normalise-text';

/** What a value of the role column may be mapped to: a stored well role, or "empty" (the row is skipped and counted). */
export const ROLE_CHOICES = ['vehicle', 'reference', 'test', 'empty'] as const;
export type RoleChoice = (typeof ROLE_CHOICES)[number];

/** The names people read on the mapping step (lib/domain/well-roles.ts: vehicle = negative control). */
export const ROLE_CHOICE_LABEL: Record<RoleChoice, string> = {
  vehicle: 'negative control',
  reference: 'positive control',
  test: 'test',
  empty: 'empty (skipped)',
};

export const isWellRole = (choice: RoleChoice): choice is WellRole => choice !== 'empty';

/**
 * The key a written value is kept under in a value map: trimmed, lower case, inner white space removed,
 * punctuation kept ("Ctrl +" and "ctrl+" are one value; "ctrl+" and "ctrl-" are two).
 */
export function valueKey(text: string): string {
  return text.normalize('NFKC').trim().toLowerCase().replace(/\s+/g, '');
}

// Words whose meaning lies in their punctuation, matched on valueKey before punctuation is dropped.
const SIGNED_CONTROL =
  /^(?:ctrl|ctl|control|cntrl)\(?([+\-\u2212\u2013])\)?$|^\(?([+\-\u2212\u2013])\)?(?:ctrl|ctl|control|cntrl)$/;

// Words matched on normaliseLabel (letters and digits only, lower case).
const WORDS: Record<RoleChoice, readonly string[]> = {
  vehicle: [
    'vehicle',
    'veh',
    'dmso',
    'neg',
    'negative',
    'ctrlneg',
    'negctrl',
    'controlneg',
    'negcontrol',
    'negativecontrol',
    'ctrlnegative',
    'negativectrl',
    'blank',
  ],
  reference: [
    'pos',
    'positive',
    'ctrlpos',
    'posctrl',
    'controlpos',
    'poscontrol',
    'positivecontrol',
    'ctrlpositive',
    'positivectrl',
    'reference',
    'ref',
    'refcompound',
  ],
  test: ['test', 'sample', 'cpd', 'cmpd', 'compound', 'testcompound'],
  empty: ['empty', 'none', 'unused'],
};

const BY_WORD = new Map<string, RoleChoice>(
  (Object.entries(WORDS) as [RoleChoice, readonly string[]][]).flatMap(([choice, words]) =>
    words.map((word) => [word, choice] as const),
  ),
);

/** Gatewell's guess for a value of the role column, or null when the word is not one it knows. */
export function guessRoleValue(text: string): RoleChoice | null {
  const signed = SIGNED_CONTROL.exec(valueKey(text));
  if (signed) return (signed[1] ?? signed[2]) === '+' ? 'reference' : 'vehicle';
  const key = normaliseLabel(text);
  if (key === '') return null;
  return BY_WORD.get(key) ?? null;
}
