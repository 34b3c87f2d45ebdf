import { describe, expect, it } from 'vitest';
import { DataError } from '../../../runner/data/data-error.ts';
import { parseNumericCsv } from '../../../runner/data/formats/csv.ts';

function catchDataError(fn: () => unknown): DataError {
  try {
    fn();
  } catch (error) {
    expect(error).toBeInstanceOf(DataError);
    return error as DataError;
  }
  throw new Error('expected a DataError');
}

describe('parseNumericCsv (RFC 4180 subset)', () => {
  it('parses header and numbers, keeping line numbers', () => {
    const t = parseNumericCsv('a,b\r\n1,2.5\n\n-3e-2,"4"\n', 'f.csv');
    expect(t.columns).toEqual(['a', 'b']);
    expect(t.rows).toBe(2);
    expect(Array.from(t.data)).toEqual([1, 2.5, -0.03, 4]);
    expect(Array.from(t.lines)).toEqual([2, 4]);
  });

  it('keeps text columns and drops ignored ones', () => {
    const t = parseNumericCsv('date,x,label\n2012-01-01,1,"rain, light"\n', 'w.csv', {
      textColumns: ['date'],
      ignoreColumns: ['label'],
    });
    expect(t.columns).toEqual(['x']);
    expect(t.text['date']).toEqual(['2012-01-01']);
  });

  it.each([
    ['a,b\n1,2\n3,x\n', 'non-numeric', 3],
    ['a,b\n1,2\n3,\n', 'non-numeric', 3],
    ['a,b\n1,NaN\n', 'non-finite', 2],
    ['a,b\n1,2\n-inf,2\n', 'non-finite', 3],
    ['a,b\n1,2\n1,2,3\n', 'ragged-row', 3],
    ['a,b\n1,"2\n', 'ragged-row', 2],
    ['', 'empty-file', 1],
    ['a,b\n', 'empty-file', 1],
  ])('%j fails with %s at row %i', (text, code, row) => {
    const error = catchDataError(() => parseNumericCsv(text, 'bad.csv'));
    expect(error.code).toBe(code);
    expect(error.row).toBe(row);
    expect(error.message).toContain(`bad.csv:${row}`);
  });
});
