/**
 * A uPlot chart that fills its container's width and follows it (tablet rotation, phone), with
 * the dashboard's axis colours and times on the site's clock. uPlot wants sorted unique x,
 * aligned arrays and null for gaps (dependencies.md); callers give it that.
 */
import uPlot from 'uplot';
import 'uplot/dist/uPlot.min.css';
import { formatSiteDateTime, siteClockDate } from './siteTime.ts';

/** Plot height, px: shorter on a phone so two plots fit a screen. */
function plotHeightPx(width: number): number {
  return width < 500 ? 220 : 280;
}

/**
 * A time axis labelled on the site's clock in 24-hour time ("14:30"), with the date under the
 * first tick of each day.
 */
export function siteTimeAxis(offsetMin: number): uPlot.Axis {
  return axis('site time', {
    size: 62,
    values: (_plot, splits) => {
      let lastDay = '';
      return splits.map((unixS) => {
        const text = formatSiteDateTime(unixS * 1000, offsetMin);
        const day = text.slice(0, 10);
        const label = day === lastDay ? text.slice(11) : `${text.slice(11)}\n${day}`;
        lastDay = day;
        return label;
      });
    },
  });
}

/** Axis style shared by every plot: dark text on light ground, readable outdoors. */
export function axis(label: string, extra: Partial<uPlot.Axis> = {}): uPlot.Axis {
  return {
    label,
    stroke: '#1b1f23',
    font: '13px system-ui, sans-serif',
    labelFont: 'bold 13px system-ui, sans-serif',
    grid: { stroke: '#d5d9de', width: 1 },
    ticks: { stroke: '#9aa1a9', width: 1 },
    ...extra,
  };
}

export interface PlotFrame {
  plot: uPlot;
  /** Replaces the data (same series). */
  setData(data: uPlot.AlignedData): void;
  destroy(): void;
}

/**
 * Creates a plot in `container`, sized to it and resized with it.
 *
 * @param options - uPlot options without width/height
 * @param data - initial aligned data
 * @param siteOffsetMin - when given, a time x axis reads the site's clock (UTC offset, min)
 */
export function createPlotFrame(
  container: HTMLElement,
  options: Omit<uPlot.Options, 'width' | 'height'>,
  data: uPlot.AlignedData,
  siteOffsetMin?: number,
): PlotFrame {
  const width = Math.max(260, container.clientWidth);
  const plot = new uPlot(
    {
      // Values under the cursor on a wide screen; on a phone (no hover) the legend only names
      // the lines, without a row of empty readouts.
      legend: { live: width >= 700 },
      ...options,
      width,
      height: plotHeightPx(width),
      ...(siteOffsetMin === undefined
        ? {}
        : { tzDate: (unixS: number) => siteClockDate(unixS, siteOffsetMin) }),
    },
    data,
    container,
  );
  const observer = new ResizeObserver(() => {
    const next = Math.max(260, container.clientWidth);
    if (Math.abs(next - plot.width) > 2) plot.setSize({ width: next, height: plotHeightPx(next) });
  });
  observer.observe(container);
  return {
    plot,
    setData: (next) => plot.setData(next),
    destroy: () => {
      observer.disconnect();
      plot.destroy();
    },
  };
}
