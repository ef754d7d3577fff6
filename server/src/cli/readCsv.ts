/**
 * Reading a CSV file named by a flag: a header row, then one record a line. Malformed CSV,
 * missing columns and bad cells become one-line `UsageError`s naming the flag, the file, the line
 * and the column.
 */
import { parse } from 'csv-parse/sync';
import { parseNumberText, type NumberRule } from './flags.ts';
import { readFileArgument } from './readFileArgument.ts';
import { UsageError } from './usageError.ts';

/** One data record of a CSV file. */
export interface CsvRecord {
  /** Line of the file the record ends on (the header is line 1), for messages. */
  readonly line: number;
  /** Cell text by column name (trimmed). */
  readonly cells: Readonly<Record<string, string>>;
}

/** A parsed CSV file with the place it came from, for messages. */
export interface CsvTable {
  /** The flag that named the file, e.g. `--csv`. */
  readonly flag: string;
  /** The path as typed. */
  readonly path: string;
  /** Column names of the header row. */
  readonly columns: readonly string[];
  /** Data records in file order (blank lines and lines starting with `#` skipped). */
  readonly records: readonly CsvRecord[];
}

interface ParsedRecord {
  record: Record<string, string>;
  info: { lines: number };
}

/**
 * Reads a CSV file with a header row that must contain `requiredColumns` (more columns are
 * allowed and ignored). A UTF-8 byte-order mark is skipped.
 *
 * @throws UsageError when the file is missing, is not valid CSV (a record with a different number
 *   of cells than the header, an unclosed quote), lacks a required column or has no data record
 */
export function readCsvFile(
  flag: string,
  path: string,
  requiredColumns: readonly string[],
  cwd: string,
): CsvTable {
  const text = readFileArgument(flag, path, cwd);
  let columns: string[] = [];
  let parsed: ParsedRecord[];
  try {
    parsed = parse(text, {
      bom: true,
      columns: (header: string[]) => (columns = header.map((name) => name.trim())),
      comment: '#',
      info: true,
      skip_empty_lines: true,
      trim: true,
    }) as ParsedRecord[];
  } catch (error) {
    throw new UsageError(
      `${flag} ${path}`,
      `is not valid CSV (${(error as Error).message})`,
      undefined,
      {
        cause: error,
      },
    );
  }
  const missing = requiredColumns.filter((column) => !columns.includes(column));
  if (missing.length > 0) {
    throw new UsageError(
      `${flag} ${path}`,
      `must have a header row with the columns ${requiredColumns.join(',')} (missing ${missing.join(', ')})`,
      columns.length === 0 ? 'an empty file' : `columns ${columns.join(',')}`,
    );
  }
  if (parsed.length === 0) {
    throw new UsageError(`${flag} ${path}`, 'must have at least one data row after the header');
  }
  return {
    flag,
    path,
    columns,
    records: parsed.map(({ record, info }) => ({ line: info.lines, cells: record })),
  };
}

/** How to name a cell in messages: `--csv log.csv line 4, column temperatureC`. */
export function describeCell(table: CsvTable, record: CsvRecord, column: string): string {
  return `${table.flag} ${table.path} line ${record.line}, column ${column}`;
}

/**
 * A numeric cell checked against `rule`.
 * @throws UsageError `--saturation s.csv line 3, column saturation must be between 0 and 1 (fraction): got 1.4`
 */
export function csvNumber(
  table: CsvTable,
  record: CsvRecord,
  column: string,
  rule: NumberRule,
): number {
  return parseNumberText(record.cells[column] ?? '', describeCell(table, record, column), rule);
}
