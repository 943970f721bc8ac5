import { describe, expect, test } from 'vitest';
import { readoutOfHeader } from '@/lib/imports/readout-words';

// Header words for the moment block is read at: Gatewell's own choice from common lab usage (first pulse
// vs n-th pulse of a train, resting vs depolarised holding potential); no published source.
describe('readoutOfHeader', () => {
  test.each([
    ['P1 block', 'tonic', 'block'],
    ['p01_block', 'tonic', 'block'],
    ['TONIC', 'tonic', ''],
    ['First pulse block (%)', 'tonic', 'block'],
    ['1st-pulse inhibition', 'tonic', 'inhibition'],
    ['Pulse 1 I compound', 'tonic', 'i compound'],
    ['Resting block', 'tonic', 'block'],
    ['P10 block', 'use_dependent', 'block'],
    ['p20 Block', 'use_dependent', 'block'],
    ['Use-dependent block', 'use_dependent', 'block'],
    ['use dependent', 'use_dependent', ''],
    ['UseDependentBlock', 'use_dependent', 'block'],
    ['nth pulse block', 'use_dependent', 'block'],
    ['10th pulse', 'use_dependent', ''],
    ['Pulse 20 inhibition', 'use_dependent', 'inhibition'],
    ['Train block', 'use_dependent', 'block'],
    ['Depolarized block', 'use_dependent', 'block'],
    ['state-dependent', 'use_dependent', ''],
  ])('%s → %s', (header, readout, rest) => {
    expect(readoutOfHeader(header)).toEqual({ readout, rest });
  });

  test.each(['Block', 'I0', 'i1', 'Peak current before', 'Rseal', 'Target', 'Compound', 'Conc', '10'])(
    '%s names no readout',
    (header) => {
      expect(readoutOfHeader(header).readout).toBeNull();
    },
  );
});
