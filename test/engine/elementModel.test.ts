import { describe, expect, it } from 'vitest';
import { BoundaryInputError } from '../../server/src/engine/boundaryInputs.ts';
import type { StressReference } from '../../server/src/engine/stressReference.ts';
import {
  HOUR_S,
  dailyWeather,
  measure,
  modelOf,
  run,
  steadyWeather,
  waterHeldM,
} from './_scenarios.ts';

describe('element model mass balance (physics.md section 3: closes to 1e-8)', () => {
  const model = modelOf('normal-concrete', 0.15, 'one-face', { initialBleedFilmKgM2: 0.2 });
  const initialHeld = waterHeldM(model, { state: model.initialState() });
  const measures = [
    measure('curing-compound', 3, 6, { efficiency: 0.7 }),
    measure('wet-covering', 8, 10),
    measure('fogging', 12, 14),
    measure('windbreak', 14, 20),
  ];
  const result = run(model, dailyWeather(1), 24, measures);
  const state = result.state;

  it('change of water held equals the water that crossed the surface over 24 h of changing weather', () => {
    const held = waterHeldM(model, result);
    const inflow = state.transport.surfaceInflowM;
    expect(inflow).toBeLessThan(0);
    expect(Math.abs(held - initialHeld - inflow) / Math.abs(inflow)).toBeLessThan(1e-8);
  });

  it('evaporation, bleeding, film and covering water add up to the same balance', () => {
    const density = model.liquidDensityKgPerM3;
    const expected =
      state.bledKgM2 -
      (state.bleedFilmKgM2 - 0.2) -
      state.transport.surfaceInflowM * density +
      state.coveringUptakeKgM2;
    expect(Math.abs(state.evaporatedKgM2 - expected) / state.evaporatedKgM2).toBeLessThan(1e-8);
  });

  it('reports the water supplied by the specific storage, smaller than the water lost', () => {
    expect(Number.isFinite(state.transport.storageWaterM)).toBe(true);
    expect(Math.abs(state.transport.storageWaterM)).toBeLessThan(
      Math.abs(state.transport.surfaceInflowM),
    );
  });
});

describe('element model behaviour', () => {
  // Near-surface steepness: saturation at 10 mm depth minus saturation at the surface.
  const steepness = (
    permeabilityMultiplier: number,
    weather: ReturnType<typeof steadyWeather>,
  ): number => {
    const model = modelOf('cement-mortar-fine', 0.05, 'one-face', { permeabilityMultiplier });
    const result = run(model, weather, 6, [], [6]);
    const profile = result.profiles[0]?.profiles;
    if (profile === undefined) throw new Error('no profile');
    const deepIndex = profile.depthM.findIndex((depth) => depth >= 0.01);
    return (profile.saturation[deepIndex] ?? Number.NaN) - (profile.saturation[0] ?? Number.NaN);
  };

  it.each([
    ['fast evaporation against low permeability', 0.1, steadyWeather(35, 0.3, 8), 'steeper'],
    ['slow evaporation against high permeability', 10, steadyWeather(20, 0.8, 0.5), 'flatter'],
  ])('profiles: %s', (_label, multiplier, weather, expected) => {
    const reference = steepness(1, steadyWeather(25, 0.5, 3));
    const value = steepness(multiplier, weather);
    if (expected === 'steeper') expect(value).toBeGreaterThan(reference);
    else expect(value).toBeLessThan(reference);
  });

  it('a bleed film delays the drying of the surface', () => {
    const firstDryH = (film: number): number => {
      const model = modelOf('normal-concrete', 0.1, 'one-face', { initialBleedFilmKgM2: film });
      const result = run(model, steadyWeather(30, 0.4, 5), 8);
      const first = result.series.find((figures) => figures.surfaceSaturation < 0.99);
      return (first?.timeS ?? Number.POSITIVE_INFINITY) / HOUR_S;
    };
    expect(firstDryH(1.0)).toBeGreaterThan(firstDryH(0) + 0.5);
  });

  it('wet covering stops drying while it is in place, and drying resumes once it is removed', () => {
    const model = modelOf('cement-mortar-fine', 0.05);
    const covered = run(model, steadyWeather(30, 0.4, 5), 12, [measure('wet-covering', 0, 6)]);
    const atSix = covered.series.find((figures) => figures.timeS === 6 * HOUR_S);
    expect(atSix?.waterLossKgM2).toBe(0);
    expect(atSix?.surfaceSaturation).toBe(1);
    expect(covered.waterLossKgM2).toBeGreaterThan(0.1);
  });

  // A curing compound multiplies the evaporation by (1 - efficiency) (physics.md section 4), so
  // a surface with the same pore structure dries slower and the drying stress, which follows the
  // contrast of equivalent pore pressure between the surface and the depth (section 5), peaks
  // lower. That holds wherever the pores do not refine during the run: the non-hydrating presets,
  // the fine mortar (its pores are already fine), and the concretes with pore refinement off.
  // The stress here is counted from placement (the whole drying of the run). Counted from final
  // set (the default) the fine mortar's order can turn: a weak compound moves drying from before
  // set (stress-free) to after it (2.68 against 2.24 MPa at 25 % in this scenario), while its
  // hardening-phase utilization still falls (see below).
  const efficiencies = [0, 0.25, 0.5, 0.9];
  const compoundRuns = (
    presetId: string,
    options: Parameters<typeof modelOf>[3] = {},
    stressReference: StressReference = 'placement',
  ): ReturnType<typeof run>[] =>
    efficiencies.map((efficiency) => {
      const measures = efficiency > 0 ? [measure('curing-compound', 0, 48, { efficiency })] : [];
      return run(
        modelOf(presetId, 0.05, 'one-face', options, { stressReference }),
        steadyWeather(30, 0.4, 5),
        12,
        measures,
      );
    });
  const falling = (values: readonly number[]): void => {
    for (let k = 1; k < values.length; k += 1) {
      expect(values[k]).toBeLessThan(values[k - 1] ?? Number.NaN);
    }
  };
  const hardeningPeakUtilization = (result: ReturnType<typeof run>): number =>
    Math.max(...result.series.filter((f) => f.phase === 'hardening').map((f) => f.utilization));
  const peakTimeS = (result: ReturnType<typeof run>): number =>
    result.series.reduce((a, f) => (f.surfaceStressPa > a.surfaceStressPa ? f : a)).timeS;

  it.each([
    ['building-stone-coarse', 'no hydration', {}],
    ['earthen-plaster', 'no hydration', {}],
    ['cement-mortar-fine', 'fine pores from the start', {}],
    ['normal-concrete', 'pore refinement off', { poreRefinement: false }],
    ['low-wc-concrete', 'pore refinement off', { poreRefinement: false }],
  ] as const)(
    'a curing compound lowers the peak surface stress of %s (%s), more the more efficient it is',
    (presetId, _why, options) => {
      falling(compoundRuns(presetId, options).map((result) => result.maxSurfaceStressPa));
    },
  );

  // In proportion: while the surface stays saturated (suction below the air entry), the water
  // content is linear in p (the specific storage) and the conductivity is k_sat / eta, so the
  // transport is linear diffusion; counted from placement, pi = p there and the stress is linear
  // in pi (physics.md 5). The stress is then proportional to the surface flux, which the
  // compound multiplies by (1 - efficiency) (physics.md 4). What is left of nonlinearity is the
  // falling-rate term of the evaporation at h = exp(p / A) > 0.9998 (|p| < 30 kPa): 0.2 % (our
  // tolerance) covers it. Past the air entry the response is not proportional: the pores drain
  // and the capillary pressure rises steeply, so a weak compound can leave the peak almost
  // unchanged and a strong one remove it (the monotone checks above).
  it.each([0.25, 0.5, 0.75])(
    'a curing compound of efficiency %s lowers the peak surface stress in proportion to (1 - efficiency) while the surface stays saturated',
    (efficiency) => {
      const model = modelOf(
        'cement-mortar-fine',
        0.05,
        'one-face',
        {},
        {
          stressReference: 'placement',
        },
      );
      const mildRun = (measures: ReturnType<typeof measure>[]) =>
        run(model, steadyWeather(15, 0.9, 0.5), 6, measures);
      const bare = mildRun([]);
      // Saturated (exactly 1: the pressure never passed the air entry) throughout the run.
      for (const figures of bare.series) expect(figures.surfaceSaturation).toBe(1);
      expect(bare.maxSurfaceStressPa).toBeGreaterThan(0);
      const compound = mildRun([measure('curing-compound', 0, 48, { efficiency })]);
      const ratio = compound.maxSurfaceStressPa / bare.maxSurfaceStressPa;
      expect(Math.abs(ratio / (1 - efficiency) - 1)).toBeLessThan(2e-3);
    },
  );

  // The exception: in the concretes the pores refine as they hydrate (physics.md section 2), so
  // a weak compound that only slows the drying lets the steepest drying profile form hours later,
  // in finer pores whose capillary pressures are higher for the same loss of water: the peak
  // stress moves later and can exceed the peak without compound (normal-concrete at 25 %:
  // about 0.15 against 0.12 MPa in this scenario; the same runs with refinement off fall, see
  // above). The strength has grown more by then, so the figure that matters for cracking, the
  // hardening-phase utilization (stress over the strength of the day, section 7), still falls.
  it.each(['normal-concrete', 'low-wc-concrete'])(
    'a curing compound on %s with pore refinement moves the stress peak later and lowers the hardening-phase utilization',
    (presetId) => {
      const results = compoundRuns(presetId, {}, 'final-set');
      falling(results.map(hardeningPeakUtilization));
      const [none, weak] = results;
      expect(peakTimeS(weak as ReturnType<typeof run>)).toBeGreaterThan(
        peakTimeS(none as ReturnType<typeof run>),
      );
    },
  );

  it.each(['final-set', 'placement'] as const)(
    "with the %s stress reference, the fine mortar's hardening-phase utilization falls with the compound efficiency",
    (stressReference) => {
      falling(
        compoundRuns('cement-mortar-fine', {}, stressReference).map(hardeningPeakUtilization),
      );
    },
  );

  // Common practice (physics.md section 5, not a published source): under harsh drying a
  // coarse-pored stone stays near 0.1 MPa, a fine-pored mortar passes its ~3 MPa tensile strength.
  it.each(['final-set', 'placement'] as const)(
    'coarse stone stays near 0.1 MPa under harsh drying (common practice; %s reference)',
    (stressReference) => {
      const stone = run(
        modelOf('building-stone-coarse', 0.05, 'one-face', {}, { stressReference }),
        steadyWeather(35, 0.3, 8),
        24,
      );
      expect(stone.maxSurfaceStressPa).toBeLessThan(0.2e6);
    },
  );

  // The stress of a mix counts from the element's final set (stressReference.ts: its bulk sets).
  // Harsh drying from placement dries the mortar's surface before set, and the drying stops its
  // hydration (physics.md 6): the skin has shrunk while the mix could still flow (the plastic
  // criterion covers that time), so after set the surface is in compression against the drier
  // bulk and its own strength stays at the floor. The scenario therefore keeps the surface wet
  // until after final set (about 2.3 h of event time at 35 degC) and dries it harshly from 6 h on.
  it('fine mortar passes its 28-day tensile strength under harsh drying that continues after final set (common practice)', () => {
    const model = modelOf('cement-mortar-fine', 0.05);
    const mortar = run(model, steadyWeather(35, 0.3, 8), 24, [measure('wet-covering', 0, 6)]);
    const fctm28Pa = (model.material.mix?.strength.fctmMPa ?? Number.NaN) * 1e6;
    expect(mortar.series.find((f) => f.timeS === 6 * HOUR_S)?.phase).toBe('hardening');
    expect(mortar.maxSurfaceStressPa).toBeGreaterThan(fctm28Pa);
    expect(hardeningPeakUtilization(mortar)).toBeGreaterThan(1);
  });

  it('fine mortar passes its 28-day tensile strength under harsh drying from placement when the stress counts from placement (common practice)', () => {
    const model = modelOf(
      'cement-mortar-fine',
      0.05,
      'one-face',
      {},
      {
        stressReference: 'placement',
      },
    );
    const mortar = run(model, steadyWeather(35, 0.3, 8), 24);
    const fctm28Pa = (model.material.mix?.strength.fctmMPa ?? Number.NaN) * 1e6;
    expect(mortar.maxSurfaceStressPa).toBeGreaterThan(fctm28Pa);
  });
});

describe('element model robustness', () => {
  const finiteRun = (result: ReturnType<typeof run>): void => {
    for (const figures of result.series) {
      expect(Number.isFinite(figures.surfaceStressPa)).toBe(true);
      expect(Number.isFinite(figures.surfaceSaturation)).toBe(true);
    }
  };

  it('bridges a 10 h gap in the weather record', () => {
    const weather = [
      ...steadyWeather(25, 0.5, 3),
      ...steadyWeather(30, 0.35, 6).map((sample) => ({ ...sample, timeS: 10 * HOUR_S })),
    ];
    finiteRun(run(modelOf('normal-concrete', 0.1), weather, 12));
  });

  it('takes a step change in wind from calm to 40 km/h and evaporates faster after it', () => {
    const [calm] = steadyWeather(25, 0.5, 0);
    if (calm === undefined) throw new Error('no weather');
    const weather = [
      calm,
      { ...calm, timeS: 3 * HOUR_S },
      { ...calm, timeS: 3 * HOUR_S + 1, windMS: 40 / 3.6 },
    ];
    const result = run(modelOf('cement-mortar-fine', 0.05), weather, 6);
    finiteRun(result);
    const before =
      result.series.find((figures) => figures.timeS === 2 * HOUR_S)?.potentialEvaporationKgM2s ?? 0;
    const after =
      result.series.find((figures) => figures.timeS === 4 * HOUR_S)?.potentialEvaporationKgM2s ?? 0;
    expect(after).toBeGreaterThan(2 * before);
  });

  it('dries slowly without wind (Uno keeps a still-air term)', () => {
    const result = run(modelOf('cement-mortar-fine', 0.05), steadyWeather(25, 0.5, 0), 6);
    finiteRun(result);
    expect(result.waterLossKgM2).toBeGreaterThan(0);
  });

  it('does not dry at 100 % humidity with air and concrete at one temperature', () => {
    const result = run(modelOf('cement-mortar-fine', 0.05), steadyWeather(20, 1, 3), 6);
    expect(result.waterLossKgM2).toBe(0);
    expect(result.series.at(-1)?.surfaceSaturation).toBe(1);
  });

  it('refuses concrete below 0 degC with a message naming the field and the rule', () => {
    const model = modelOf('normal-concrete', 0.1);
    const state = model.initialState();
    const inputs = {
      airTemperatureK: 268.15,
      relativeHumidity: 0.8,
      windMS: 2,
      surfaceTemperatureK: 271.15,
    };
    expect(() => model.advanceTo(state, HOUR_S, inputs)).toThrow(BoundaryInputError);
    expect(() => model.advanceTo(state, HOUR_S, inputs)).toThrow(
      /surfaceTemperatureK must be at or above 0 degC.*freezing.*got 271.15/,
    );
  });

  it.each(['earthen-plaster', 'cement-mortar-fine', 'building-stone-coarse'])(
    '%s dries to equilibrium with desert air (45 degC, 5 %% RH, 80 km/h) without failing',
    (presetId) => {
      const result = run(modelOf(presetId, 0.02), steadyWeather(45, 0.05, 22), 24);
      finiteRun(result);
      // At equilibrium the surface pore humidity equals the air humidity (Kelvin).
      expect(result.series.at(-1)?.surfaceRelativeHumidity).toBeCloseTo(0.05, 2);
    },
  );

  it('runs 7 days of daily weather without blowing up', () => {
    const model = modelOf('normal-concrete', 0.2, 'two-face');
    const initialHeld = waterHeldM(model, { state: model.initialState() });
    const result = run(model, dailyWeather(7), 7 * 24);
    finiteRun(result);
    expect(result.maxSurfaceStressPa).toBeLessThan(50e6);
    const inflow = result.state.transport.surfaceInflowM;
    expect(
      Math.abs(waterHeldM(model, result) - initialHeld - inflow) / Math.abs(inflow),
    ).toBeLessThan(1e-8);
  });
});

describe('element model maturity by depth (physics.md section 6)', () => {
  it('takes probe temperatures by depth: the warmer core gains equivalent age faster', () => {
    const model = modelOf('normal-concrete', 0.2, 'one-face', { hydrationHumidityFactor: false });
    const state = model.initialState();
    model.advanceTo(state, 6 * HOUR_S, {
      airTemperatureK: 293.15,
      relativeHumidity: 0.9,
      windMS: 0,
      surfaceTemperatureK: 293.15,
      probeTemperatures: [
        { depthM: 0.01, temperatureK: 293.15 },
        { depthM: 0.15, temperatureK: 313.15 },
      ],
    });
    const surfaceAgeH = (state.equivalentAgeS[0] ?? Number.NaN) / HOUR_S;
    const coreAgeH = (state.equivalentAgeS[59] ?? Number.NaN) / HOUR_S;
    // ASTM C1074 Arrhenius at 20 degC (reference) is real time: 6 h; at 40 degC with 40 kJ/mol
    // the factor is exp(-40000/8.314 (1/313.15 - 1/293.15)) = 2.85 (computed by hand).
    expect(surfaceAgeH).toBeCloseTo(6, 6);
    expect(coreAgeH / 6).toBeCloseTo(2.85, 2);
  });

  it('slows hydration where the pores dry: the surface ages slower than the core under drying', () => {
    const model = modelOf('cement-mortar-fine', 0.05);
    const result = run(model, steadyWeather(30, 0.3, 6), 24);
    const ages = result.state.equivalentAgeS;
    expect(ages[0]).toBeLessThan(0.9 * (ages[ages.length - 1] ?? Number.NaN));
  });
});

describe('element model options', () => {
  it('refines the pores as the concrete hydrates (physics.md section 2, default on) and not when off', () => {
    const weather = steadyWeather(20, 0.9, 1);
    const refined = run(modelOf('normal-concrete', 0.1), weather, 24).state.diameterScale;
    const fixed = run(
      modelOf('normal-concrete', 0.1, 'one-face', { poreRefinement: false }),
      weather,
      24,
    ).state.diameterScale;
    expect(refined[30]).toBeLessThan(0.6);
    expect(Array.from(fixed).every((scale) => scale === 1)).toBe(true);
  });

  it('vapour diffusion (default on) lets the surface keep drying after the liquid path breaks', () => {
    const weather = steadyWeather(35, 0.3, 8);
    const withVapour = run(modelOf('building-stone-coarse', 0.05), weather, 24).waterLossKgM2;
    const liquidOnly = run(
      modelOf('building-stone-coarse', 0.05, 'one-face', { vapourDiffusion: false }),
      weather,
      24,
    ).waterLossKgM2;
    expect(withVapour).toBeGreaterThan(liquidOnly);
  });

  it('curl acts as flat for two-face drying (a symmetric profile has no linear part)', async () => {
    const { createElementModel } = await import('../../server/src/engine/elementModel.ts');
    const { loadMaterialPreset } = await import('../../server/src/engine/materialPreset.ts');
    const peak = (stressMode: 'flat' | 'curl') =>
      run(
        createElementModel({
          material: loadMaterialPreset('cement-mortar-fine'),
          thicknessM: 0.04,
          dryingCase: 'two-face',
          stressMode,
        }),
        steadyWeather(30, 0.4, 5),
        6,
      ).maxSurfaceStressPa;
    expect(peak('curl')).toBe(peak('flat'));
  });
});
