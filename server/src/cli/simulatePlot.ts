/**
 * The figure of `meniscus simulate --plot`: vega-lite 5 compiled and rendered by vega 5 to SVG,
 * PNG through resvg.
 */
import { writeFile } from 'node:fs/promises';

/** One point of the series over time (MPa, h; utilization as physics.md section 7). */
export interface SeriesRow {
  timeH: number;
  phase: string;
  surfaceStressMPa: number;
  fctmMPa: number;
  utilization: number;
}
/** One depth profile (mm, saturation 0..1) at a time (h). */
export interface ProfileRow {
  timeH: number;
  depthMm: number[];
  saturation: number[];
}

/**
 * Figure of a run with vega-lite 5 rendered by vega 5 to SVG (PNG through resvg): surface stress
 * and tensile strength over time; the utilization of each phase over time with the line at 1
 * (before final set the stress is zero while the suction builds, so only this panel shows the
 * plastic phase's risk); saturation profiles at the requested hours.
 */
export async function writePlot(
  path: string,
  series: readonly SeriesRow[],
  profiles: readonly ProfileRow[],
) {
  const [vega, vegaLite] = await Promise.all([import('vega'), import('vega-lite')]);
  const overTime = series.flatMap((row) => [
    { timeH: row.timeH, valueMPa: row.surfaceStressMPa, quantity: 'surface stress' },
    { timeH: row.timeH, valueMPa: row.fctmMPa, quantity: 'tensile strength' },
  ]);
  const depth = profiles.flatMap((profile) =>
    profile.depthMm.map((depthMm, index) => ({
      depthMm,
      saturation: profile.saturation[index],
      timeH: profile.timeH,
    })),
  );
  const timePanel = {
    title: 'Surface stress against tensile strength',
    width: 520,
    height: 220,
    data: { values: overTime },
    mark: 'line',
    encoding: {
      x: { field: 'timeH', type: 'quantitative', title: 'time since placement (h)' },
      y: { field: 'valueMPa', type: 'quantitative', title: 'MPa' },
      color: { field: 'quantity', type: 'nominal', title: null },
      strokeDash: { field: 'quantity', type: 'nominal', title: null },
    },
  };
  const utilizationPanel = {
    title: 'Utilization (plastic: suction over critical suction; hardening: stress over strength)',
    width: 520,
    height: 160,
    layer: [
      {
        data: {
          values: series.map(({ timeH, phase, utilization }) => ({ timeH, phase, utilization })),
        },
        mark: 'line',
        encoding: {
          x: { field: 'timeH', type: 'quantitative', title: 'time since placement (h)' },
          y: { field: 'utilization', type: 'quantitative', title: 'utilization' },
          color: { field: 'phase', type: 'nominal', title: 'phase' },
        },
      },
      {
        data: { values: [{ utilization: 1, label: 'cracking likely at 1' }] },
        layer: [
          {
            mark: { type: 'rule', strokeDash: [4, 3], color: '#555' },
            encoding: { y: { field: 'utilization', type: 'quantitative' } },
          },
          {
            mark: { type: 'text', align: 'left', dx: 4, dy: -6, color: '#555' },
            encoding: {
              y: { field: 'utilization', type: 'quantitative' },
              x: { value: 0 },
              text: { field: 'label' },
            },
          },
        ],
      },
    ],
  };
  const depthPanel = {
    title: 'Saturation profiles',
    width: 520,
    height: 220,
    data: { values: depth },
    mark: 'line',
    encoding: {
      x: { field: 'depthMm', type: 'quantitative', title: 'depth below the exposed surface (mm)' },
      y: {
        field: 'saturation',
        type: 'quantitative',
        title: 'saturation',
        scale: { domain: [0, 1] },
      },
      color: { field: 'timeH', type: 'ordinal', title: 'time (h)' },
    },
  };
  const spec = {
    $schema: 'https://vega.github.io/schema/vega-lite/v5.json',
    vconcat:
      depth.length > 0 ? [timePanel, utilizationPanel, depthPanel] : [timePanel, utilizationPanel],
    resolve: { scale: { color: 'independent', strokeDash: 'independent' } },
  };
  const compiled = vegaLite.compile(spec as unknown as Parameters<typeof vegaLite.compile>[0]);
  const view = new vega.View(vega.parse(compiled.spec), { renderer: 'none' });
  const svg = await view.toSVG();
  if (/\.svg$/i.test(path)) {
    await writeFile(path, svg);
  } else {
    const { Resvg } = await import('@resvg/resvg-js');
    await writeFile(path, new Resvg(svg, { background: 'white' }).render().asPng());
  }
}
