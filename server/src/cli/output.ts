/**
 * Rendering a command's report: one JSON object on stdout with `--json`, readable tables
 * otherwise. Both carry the cautions of physics.md (last section): the JSON as a `caution`
 * string key, the text as a closing line.
 */
import Table from 'cli-table3';

/** The cautions every output carries, in full (physics.md, "Cautions that every output carries"). */
export const CAUTION =
  'Estimates only: a model fed by a few inputs. Decisions on curing, protection, stripping and ' +
  'loading stay with the project specifications, local codes and the responsible licensed ' +
  'engineer; confirm strength with field-cured specimens or in-place tests as the ' +
  'specifications require.';

/** The closing line of human-readable output: the same cautions. */
export const CAUTION_LINE = `Caution: ${CAUTION}`;

/** A table of the human-readable output. */
export interface ReportTable {
  /** Heading printed above the table. */
  readonly title: string;
  /** Column headings; without them the table is a list of label / value / unit rows. */
  readonly head?: readonly string[];
  /** Cells, already formatted (see {@link formatNumber}). */
  readonly rows: readonly (readonly string[])[];
}

/** What a command returns: the same result for machines and for people. */
export interface CommandReport {
  /**
   * The JSON object printed with `--json`. Numeric keys carry their unit as a suffix
   * (`evaporationKgM2h`, `fctmMPa`); the framework adds `caution`.
   */
  readonly json: Readonly<Record<string, unknown>>;
  /** Tables of the human-readable output, in order. */
  readonly tables: readonly ReportTable[];
  /** Lines printed after the tables: assumptions made, warnings about the input. */
  readonly notes?: readonly string[];
}

/**
 * Formats a number for a table: fixed decimals, `n/a` for NaN or infinite values.
 * @param value the number
 * @param decimals digits after the point (default 2)
 */
export function formatNumber(value: number, decimals = 2): string {
  return Number.isFinite(value) ? value.toFixed(decimals) : 'n/a';
}

/** The JSON text printed with `--json`: the report's object plus `caution`, indented. */
export function renderJson(report: CommandReport): string {
  return `${JSON.stringify({ ...report.json, caution: CAUTION }, null, 2)}\n`;
}

/** The human-readable text: titled tables, notes, then the caution line. */
export function renderText(report: CommandReport): string {
  const blocks = report.tables.map((table) => {
    const rendered = new Table({
      ...(table.head === undefined ? {} : { head: [...table.head] }),
      style: { head: [], border: [] },
      chars: { mid: '', 'left-mid': '', 'mid-mid': '', 'right-mid': '' },
    });
    for (const row of table.rows) rendered.push([...row]);
    return `${table.title}\n${rendered.toString()}`;
  });
  const notes = (report.notes ?? []).map((note) => `Note: ${note}`);
  return `${[...blocks, ...(notes.length > 0 ? [notes.join('\n')] : []), CAUTION_LINE].join('\n\n')}\n`;
}
