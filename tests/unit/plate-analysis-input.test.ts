// The one adapter from stored (or parsed) plate data to analysePlate's input: every column reaches the
// field of the same quantity, and a parsed export's readouts keep their spreadsheet rows as names.
import { describe, expect, test } from 'vitest';
import type { ParsedPlate } from '@/lib/imports/build-plate';
import { analysisInput, parsedPlateInput } from '@/lib/plates/analysis-input';

describe('analysisInput', () => {
  test('maps each stored column to the quantity of the same name and unit, in order', () => {
    const input = analysisInput(
      [
        {
          id: 'w1',
          role: 'test',
          compoundId: 'c1',
          concentration_uM: 3,
          sealResistance_GOhm: 1.2,
          seriesResistance_MOhm: 8,
          capacitance_pF: 15,
          excluded: true,
        },
        {
          id: 'w2',
          role: 'vehicle',
          compoundId: null,
          concentration_uM: null,
          sealResistance_GOhm: null,
          seriesResistance_MOhm: null,
          capacitance_pF: null,
        },
      ],
      [
        { id: 'r2', wellId: 'w2', targetId: 't1', controlCurrent_pA: -900, compoundCurrent_pA: -880 },
        { id: 'r1', wellId: 'w1', targetId: 't1', controlCurrent_pA: -1000, compoundCurrent_pA: -400 },
      ],
    );
    expect(input.wells).toEqual([
      {
        id: 'w1',
        role: 'test',
        compoundId: 'c1',
        concentration_uM: 3,
        sealResistance_GOhm: 1.2,
        seriesResistance_MOhm: 8,
        capacitance_pF: 15,
        excluded: true,
      },
      {
        id: 'w2',
        role: 'vehicle',
        compoundId: null,
        concentration_uM: null,
        sealResistance_GOhm: null,
        seriesResistance_MOhm: null,
        capacitance_pF: null,
        excluded: false,
      },
    ]);
    expect(input.readouts).toEqual([
      { id: 'r2', wellId: 'w2', target: 't1', controlCurrent_pA: -900, compoundCurrent_pA: -880 },
      { id: 'r1', wellId: 'w1', target: 't1', controlCurrent_pA: -1000, compoundCurrent_pA: -400 },
    ]);
  });
});

describe('parsedPlateInput', () => {
  test('names wells by their place in the plate and readouts by their spreadsheet row', () => {
    const plate: ParsedPlate = {
      format: 96,
      formatSource: 'inferred',
      rows: 8,
      columns: 12,
      targets: ['Nav1.7', 'Kv7.2'],
      wells: [
        {
          position: 'A1',
          rowIndex: 0,
          columnIndex: 0,
          role: 'vehicle',
          compound: null,
          concentration_uM: null,
          sealResistance_GOhm: 2,
          seriesResistance_MOhm: 6,
          capacitance_pF: 12,
          readouts: [{ target: 'Nav1.7', controlCurrent_pA: -1500, compoundCurrent_pA: -1450, row: 7 }],
        },
        {
          position: 'A2',
          rowIndex: 0,
          columnIndex: 1,
          role: 'test',
          compound: 'GW-1',
          concentration_uM: 10,
          sealResistance_GOhm: 0.4,
          seriesResistance_MOhm: 30,
          capacitance_pF: 40,
          readouts: [
            { target: 'Nav1.7', controlCurrent_pA: -1200, compoundCurrent_pA: -300, row: 9 },
            { target: 'Kv7.2', controlCurrent_pA: 800, compoundCurrent_pA: null, row: 10 },
          ],
        },
      ],
    };
    const input = parsedPlateInput(plate);
    expect(input.wells).toEqual([
      {
        id: '0',
        role: 'vehicle',
        compoundId: null,
        concentration_uM: null,
        sealResistance_GOhm: 2,
        seriesResistance_MOhm: 6,
        capacitance_pF: 12,
        excluded: false,
      },
      {
        id: '1',
        role: 'test',
        compoundId: 'GW-1',
        concentration_uM: 10,
        sealResistance_GOhm: 0.4,
        seriesResistance_MOhm: 30,
        capacitance_pF: 40,
        excluded: false,
      },
    ]);
    expect(input.readouts).toEqual([
      { id: '7', wellId: '0', target: 'Nav1.7', controlCurrent_pA: -1500, compoundCurrent_pA: -1450 },
      { id: '9', wellId: '1', target: 'Nav1.7', controlCurrent_pA: -1200, compoundCurrent_pA: -300 },
      { id: '10', wellId: '1', target: 'Kv7.2', controlCurrent_pA: 800, compoundCurrent_pA: null },
    ]);
  });
});
