/**
 * The simulators against the real ingest: every pack they publish is valid SenML the ingest
 * stores; the faults they inject are seen (silence and a stuck sensor by the quality detectors
 * on the stored readings; hostile payloads quarantined with the right reason); statuses and the
 * last will reach the archive. Plays on a virtual clock with the documented stand-in truth (the
 * plumbing under test does not depend on the drying physics); the engine-driven play is
 * checked in engineTruth.test.ts.
 */
import { afterAll, beforeAll, describe, expect, it } from 'vitest';
import { detectSilence } from '../../server/src/quality/detectSilence.ts';
import { detectStuck } from '../../server/src/quality/detectStuck.ts';
import { hostilePayloads } from '../../simulators/src/hostilePayloads.ts';
import { connectDevice } from '../../simulators/src/mqttDevice.ts';
import { virtualClock } from '../../simulators/src/playClock.ts';
import { playScenario, probeDepthsMm } from '../../simulators/src/playScenario.ts';
import type { PlayResult } from '../../simulators/src/playScenario.ts';
import { DEMO_SCENARIO, loadScenarioFolder } from '../../simulators/src/scenarioFolder.ts';
import { createStandInTruth } from '../../simulators/src/standInTruth.ts';
import { waitUntil } from '../helpers/ingestRig.ts';
import { startScenarioRig } from './_scenarioRig.ts';
import type { ScenarioRig } from './_scenarioRig.ts';

const { scenario, runConfig, runConfigInput } = loadScenarioFolder(DEMO_SCENARIO);
const PLAYED_H = 6; // 11:00 to 17:00: covers the stuck sensor (14:30) and the silence (16:00-16:30)

describe('playScenario() against the real ingest (embedded broker, archive on disk)', () => {
  let rig: ScenarioRig;
  let result: PlayResult;
  beforeAll(async () => {
    rig = await startScenarioRig(runConfigInput);
    result = await playScenario({
      scenario,
      site: runConfig.site,
      url: rig.url,
      speed: 120,
      clock: virtualClock(),
      durationH: PLAYED_H,
      truth: createStandInTruth(scenario.truth, probeDepthsMm(scenario)),
    });
  }, 60_000);
  afterAll(async () => {
    await rig.dispose();
  });

  it('stores every reading it sends and quarantines none', () => {
    const readings = rig.archive.readings(rig.runId);
    const sensorsPerPack = new Map<string, number>([
      [scenario.weather.device, Object.keys(runConfig.weather.sensors).length],
      ...scenario.probeStrings.map((p) => [p.device, p.sensors.length] as [string, number]),
    ]);
    expect(result.packsSent).toBeGreaterThan(PLAYED_H * 60 * 2);
    expect(rig.ingestor.counters.messages).toBe(result.packsSent);
    expect(rig.archive.quarantineCounts(rig.runId)).toEqual({});
    const expectedReadings = [...sensorsPerPack.keys()].reduce(
      (sum, device) =>
        sum +
        (sensorsPerPack.get(device) ?? 0) *
          new Set(readings.filter((r) => r.device === device).map((r) => r.messageId)).size,
      0,
    );
    expect(readings.length).toBe(expectedReadings);
    expect(rig.ingestor.counters.readingsStored).toBe(readings.length);
  });

  it('sends SenML with ut, units and event times inside the played window', () => {
    const readings = rig.archive.readings(rig.runId);
    const startMs = Date.parse(scenario.startAt);
    for (const reading of readings) {
      expect(reading.updateIntervalS).toBe(60);
      // device clocks drift by at most 35 ppm and start at most 2 s off
      expect(reading.eventAtMs).toBeGreaterThanOrEqual(startMs - 3000);
      expect(reading.eventAtMs).toBeLessThanOrEqual(startMs + PLAYED_H * 3_600_000 + 3000);
    }
    expect(new Set(readings.map((r) => r.unit))).toEqual(
      new Set(['Cel', '%RH', 'm/s', 'W/m2', 'mm']),
    );
  });

  it("detectStuck() finds probe-c7's t-20 stuck from 14:30 and no other probe sensor stuck", () => {
    const stuckFromMs = Date.parse('2026-07-16T14:30:00+02:00');
    for (const probe of runConfig.probes) {
      const series = rig.archive.readings(rig.runId, { sensor: `${probe.device}/${probe.sensor}` });
      const stretches = detectStuck(series, { windowS: 1800 });
      if (probe.device === 'probe-c7' && probe.sensor === 't-20') {
        expect(stretches).toHaveLength(1);
        // Its first stuck value is the last one it sent before 14:30, or earlier when the readings
        // just before were already equal at the sensor's 0.1 K resolution (20 mm follows the
        // surface within minutes, near the afternoon peak): within five intervals and drift.
        expect(Math.abs((stretches[0]?.fromMs ?? 0) - stuckFromMs)).toBeLessThan(5 * 60_000 + 5000);
      } else {
        expect(stretches, `${probe.device}/${probe.sensor}`).toEqual([]);
      }
    }
  });

  it("detectSilence() finds probe-c7's half hour of silence from 16:00 and takes dropouts for dropouts", () => {
    const silenceFromMs = Date.parse('2026-07-16T16:00:00+02:00');
    for (const device of ['probe-c5', 'probe-c7', 'mast-l3']) {
      const series = rig.archive
        .readings(rig.runId)
        .filter((r) => r.device === device && (r.sensor === 'rh-05' || r.sensor === 'air-t'));
      // Grace of four intervals: a run of two or three lost packs (probe-c7 loses 2 %) is a
      // dropout a crew would not call silence; half an hour is.
      const silences = detectSilence(series, { graceFactor: 4 });
      if (device === 'probe-c7') {
        expect(silences).toHaveLength(1);
        expect(Math.abs((silences[0]?.fromMs ?? 0) - silenceFromMs)).toBeLessThan(
          2 * 60_000 + 5000,
        );
        expect(silences[0]?.gapS).toBeGreaterThanOrEqual(30 * 60);
      } else {
        expect(silences, device).toEqual([]);
      }
    }
    expect(result.packsSilenced).toBe(30);
    expect(result.packsDropped).toBeGreaterThan(0);
  });

  it('leaves each device a retained status the archive records', () => {
    const statuses = rig.deviceStatuses();
    for (const device of ['probe-c5', 'probe-c7', 'mast-l3'])
      expect(statuses.get(device)).toBe('stopped');
  });
});

describe('faults a device injects are seen by the ingest', () => {
  let rig: ScenarioRig;
  beforeAll(async () => {
    rig = await startScenarioRig({
      ...(runConfigInput as object),
      placedAt: new Date(Date.now() - 3_600_000).toISOString(),
    });
  });
  afterAll(async () => {
    await rig.dispose();
  });

  it.each(hostilePayloads('t-20').map((hostile) => [hostile.what, hostile] as const))(
    '%s is quarantined with its reason',
    async (_what, hostile) => {
      const device = await connectDevice({
        url: rig.url,
        site: runConfig.site,
        device: 'probe-c7',
      });
      const before = rig.archive.quarantineCounts(rig.runId)[hostile.reason] ?? 0;
      await device.publish(hostile.payload('probe-c7', Date.now() - 60_000));
      await device.close();
      expect(rig.archive.quarantineCounts(rig.runId)[hostile.reason] ?? 0).toBe(before + 1);
    },
  );

  it('the last will marks a device that drops off offline', async () => {
    const device = await connectDevice({ url: rig.url, site: runConfig.site, device: 'probe-c5' });
    await waitUntil(() => rig.deviceStatuses().get('probe-c5') === 'online', 5000, 'online status');
    device.crash();
    await waitUntil(() => rig.deviceStatuses().get('probe-c5') === 'offline', 5000, 'last will');
  });
});
