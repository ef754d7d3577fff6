/**
 * One measured figure of a benchmark: a value, the baseline it is compared with (run in the same
 * process, on the same machine, just before or after), and their ratio. Targets are stated as
 * ratios because absolute times depend on the machine.
 */
export interface BenchFigure {
  /** Stable identifier, e.g. `engine.costPerCellStepVsTridiagonal`. */
  name: string;
  /** The measured value in `unit`. */
  value: number;
  unit: string;
  /** What the value is compared with, in the same unit, or null when the figure is absolute. */
  baseline: number | null;
  /** value / baseline, or null when there is no baseline. */
  ratio: number | null;
  /** The target in words, e.g. "ratio <= 20". */
  target?: string;
  /** Whether the target is met, when there is one. */
  met?: boolean;
  /** Anything a reader needs to interpret the figure (sizes, repetitions). */
  detail?: string;
}

/** A benchmark suite: a module in bench/suites/ whose default export runs it. */
export type BenchSuite = () => Promise<BenchFigure[]>;

/** Builds a figure with its ratio computed from value and baseline. */
export function ratioFigure(
  fields: Omit<BenchFigure, 'ratio'> & { baseline: number },
): BenchFigure {
  return { ...fields, ratio: fields.value / fields.baseline };
}
