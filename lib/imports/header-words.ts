import 'server-only';
import type { ImportField } from './import-fields';

/** How Gatewell recognises a field in a header whose unit has been removed and that was normalised ("icontrol"). */
interface HeaderRule {
  /** Whole-header spellings; a match scores 2. */
  exact: string[];
  /** A looser test on the header; a match scores 1. */
  loose: (header: string) => boolean;
}

const currentLike = (h: string) => /^i|current|amp|peak/.test(h);
const has = (h: string, words: string[]) => words.some((word) => h.includes(word));

/** Header spellings per field, all written by Gatewell from common lab usage. */
export const HEADER_RULES: Record<ImportField, HeaderRule> = {
  well: {
    exact: ['well', 'wellid', 'wellposition', 'position', 'pos', 'wellpos', 'wellname', 'welllabel'],
    loose: (h) => h.includes('well') && !has(h, ['type', 'role', 'kind', 'class', 'category']),
  },
  compound: {
    exact: [
      'compound',
      'compoundid',
      'compoundidentifier',
      'compoundname',
      'cmpd',
      'cmpdid',
      'sample',
      'sampleid',
      'substance',
      'substanceid',
      'molecule',
      'moleculeid',
      'testarticle',
      'drug',
      'drugid',
      'identifier',
      'id',
    ],
    loose: (h) =>
      has(h, ['compound', 'cmpd', 'substance', 'molecule']) &&
      !has(h, ['conc', 'unit', 'current']) &&
      !h.startsWith('i'),
  },
  concentration: {
    exact: [
      'conc',
      'concentration',
      'dose',
      'testconc',
      'testconcentration',
      'finalconc',
      'finalconcentration',
      'compoundconc',
      'compoundconcentration',
      'cmpdconc',
    ],
    loose: (h) => has(h, ['conc', 'dose']) && !h.includes('unit'),
  },
  concentrationUnit: {
    exact: ['concunit', 'concunits', 'concentrationunit', 'concentrationunits', 'doseunit', 'unit', 'units'],
    loose: (h) => has(h, ['conc', 'dose']) && h.includes('unit'),
  },
  target: {
    exact: [
      'target',
      'targetname',
      'channel',
      'ionchannel',
      'channelname',
      'assay',
      'assaytarget',
      'readout',
      'readoutname',
    ],
    loose: (h) => has(h, ['target', 'channel']),
  },
  controlCurrent: {
    exact: [
      'icontrol',
      'controlcurrent',
      'ictrl',
      'ctrlcurrent',
      'ipre',
      'precurrent',
      'currentpre',
      'currentcontrol',
      'ibaseline',
      'baselinecurrent',
      'ibefore',
      'currentbefore',
      'i0',
      'peakcontrol',
      'controlpeak',
    ],
    loose: (h) => has(h, ['control', 'ctrl', 'pre', 'baseline', 'before']) && currentLike(h),
  },
  compoundCurrent: {
    exact: [
      'icompound',
      'compoundcurrent',
      'icmpd',
      'cmpdcurrent',
      'ipost',
      'postcurrent',
      'currentpost',
      'currentcompound',
      'itest',
      'testcurrent',
      'idrug',
      'drugcurrent',
      'iafter',
      'currentafter',
      'i1',
      'peakcompound',
      'compoundpeak',
    ],
    loose: (h) => has(h, ['compound', 'cmpd', 'post', 'drug', 'after', 'test']) && currentLike(h),
  },
  block: {
    exact: [
      'block',
      'fractionalblock',
      'fractionblock',
      'blockfraction',
      'blockpercent',
      'percentblock',
      'pctblock',
      'blocked',
      'fractionblocked',
      'inhibition',
      'percentinhibition',
      'inhibitionpercent',
      'pctinhibition',
      'inhibitionpct',
      'fractioninhibition',
      'inhibitionfraction',
      'inhib',
      'inh',
    ],
    loose: (h) => /inhib|block(?!er)/.test(h) && !has(h, ['conc', 'compound', 'name', 'id']),
  },
  // Use-dependent columns are found by their readout words (readout-words.ts) beside a current or block.
  useDependentControlCurrent: { exact: [], loose: () => false },
  useDependentCompoundCurrent: { exact: [], loose: () => false },
  useDependentBlock: { exact: [], loose: () => false },
  currentUnit: {
    exact: ['currentunit', 'currentunits', 'iunit', 'iunits'],
    loose: (h) => h.includes('current') && h.includes('unit'),
  },
  sealResistance: {
    exact: ['rseal', 'seal', 'sealresistance', 'sealres', 'sealr'],
    loose: (h) => h.includes('seal'),
  },
  seriesResistance: {
    exact: [
      'rs',
      'rseries',
      'seriesresistance',
      'seriesres',
      'raccess',
      'accessresistance',
      'access',
      'ra',
      'seriesr',
    ],
    loose: (h) => has(h, ['series', 'access']),
  },
  capacitance: {
    exact: ['cm', 'cap', 'capacitance', 'cellcapacitance', 'membranecapacitance', 'cslow', 'ccell'],
    loose: (h) => h.includes('capacit'),
  },
  role: {
    exact: [
      'role',
      'wellrole',
      'welltype',
      'type',
      'kind',
      'category',
      'sampletype',
      'wellcategory',
      'wellclass',
    ],
    loose: (h) => has(h, ['role', 'welltype']),
  },
};
