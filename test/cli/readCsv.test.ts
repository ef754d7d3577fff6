/**
 * readCsvFile(): what a logger export may contain (byte-order mark, comment lines, blank lines,
 * quoted cells, extra columns, CRLF line ends) and the line numbers messages name.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { csvNumber, readCsvFile } from '../../server/src/cli/readCsv.ts';
import { fixtureFolder, type FixtureFolder } from './_runCli.ts';

let folder: FixtureFolder;
beforeAll(() => {
  folder = fixtureFolder();
  folder.write(
    'export.csv',
    '\uFEFF# exported by the site logger\r\nprobe,time,temperatureC\r\n"A, north",2026-05-06T18:00Z,21.5\r\n\r\nA,2026-05-06T18:30Z, 22.0 \r\n',
  );
});
afterAll(() => folder.remove());

describe('readCsvFile()', () => {
  it('skips the byte-order mark, comments and blank lines, keeps quoted commas, trims cells', () => {
    const table = readCsvFile('--csv', 'export.csv', ['time', 'temperatureC'], folder.path);
    expect(table.columns).toEqual(['probe', 'time', 'temperatureC']);
    expect(table.records.map((record) => record.cells)).toEqual([
      { probe: 'A, north', time: '2026-05-06T18:00Z', temperatureC: '21.5' },
      { probe: 'A', time: '2026-05-06T18:30Z', temperatureC: '22.0' },
    ]);
  });

  it('numbers records by the file line they are on, for messages', () => {
    const table = readCsvFile('--csv', 'export.csv', ['time', 'temperatureC'], folder.path);
    expect(table.records.map((record) => record.line)).toEqual([3, 5]);
    const second = table.records[1];
    if (second === undefined) throw new Error('second record missing');
    expect(() => csvNumber(table, second, 'temperatureC', { unit: 'degC', max: 20 })).toThrow(
      '--csv export.csv line 5, column temperatureC must be at most 20 (degC): got 22.0',
    );
  });
});
