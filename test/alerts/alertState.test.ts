import { describe, expect, it } from 'vitest';
import { DEFAULT_ALERT_OPTIONS, parseAlertOptions } from '../../server/src/alerts/alertOptions.ts';
import { AlertState } from '../../server/src/alerts/alertState.ts';
import { noticeRules } from '../../server/src/alerts/noticeRules.ts';
import type { NoticeDraft } from '../../server/src/alerts/types.ts';
import { CONFIG, MIN, T0, runState } from './_runStates.ts';
import type { StateFigures } from './_runStates.ts';

/** Feeds one state per step (5 min of event time apart); returns `minute level kind` per notice. */
function play(
  steps: StateFigures[],
  state = new AlertState(DEFAULT_ALERT_OPTIONS),
  acknowledged: (id: string) => boolean = () => false,
  fromStep = 0,
): string[] {
  const lines: string[] = [];
  steps.forEach((figures, stepIndex) => {
    const index = fromStep + stepIndex;
    const timeMs = T0 + index * 5 * MIN;
    const findings = noticeRules(runState({ ...figures, timeMs }), CONFIG, DEFAULT_ALERT_OPTIONS);
    for (const draft of state.update(findings, timeMs, acknowledged)) {
      lines.push(describeDraft(draft, index * 5));
      state.noticeSent(draft.conditionKey, `n-${index}`, draft.kind);
    }
  });
  return lines;
}

function describeDraft(draft: NoticeDraft, minute: number): string {
  const eased = draft.eased === null ? '' : ` ${draft.eased.from}->${draft.eased.to ?? 'none'}`;
  return `${minute} ${draft.level} ${draft.kind}${eased}${draft.repeat ? ' repeat' : ''}`;
}

const repeat = (figures: StateFigures, times: number): StateFigures[] =>
  Array.from({ length: times }, () => figures);
const quiet: StateFigures = { utilization: 0.2 };

describe('AlertState', () => {
  it('update() sends a concern once while it holds at the same level (de-duplication)', () => {
    expect(play(repeat({ probability: 0.5 }, 5))).toEqual(['0 PREPARE margin-outlook']);
  });

  it('update() escalates at once to a higher level, each level one notice', () => {
    expect(
      play([
        { probability: 0.5 },
        { probability: 0.8, closingInMin: 80 },
        { probability: 0.8, closingInMin: 75 },
        { probability: 0.9, closingInMin: 10 },
      ]),
    ).toEqual([
      '0 PREPARE margin-outlook',
      '5 ACT NOW margin-outlook',
      '15 CRACKING LIKELY margin-outlook',
    ]);
  });

  it('update() holds a raised level while the figure stays within the hysteresis band', () => {
    // 0.60 raises ACT NOW; 0.55 and 0.53 lie above 0.57 - 0.05 and hold it for 8 steps (40 min)
    const steps = [
      { utilization: 0.6 },
      ...repeat({ utilization: 0.55 }, 4),
      ...repeat({ utilization: 0.53 }, 4),
    ];
    // (acknowledged, so that no repeat is due either)
    expect(play(steps, undefined, () => true)).toEqual(['0 ACT NOW utilization']);
  });

  it('update() eases with a NOTE only after the dwell (30 min) below the hold thresholds', () => {
    const steps = [{ utilization: 0.6 }, ...repeat({ utilization: 0.4 }, 8)];
    // below from minute 5; 30 min later, at minute 35, it eases
    expect(play(steps)).toEqual(['0 ACT NOW utilization', '35 NOTE eased ACT NOW->none']);
  });

  it('update() restarts the dwell when the figure comes back within the band', () => {
    const steps = [
      { utilization: 0.6 },
      ...repeat({ utilization: 0.4 }, 4),
      { utilization: 0.55 },
      ...repeat({ utilization: 0.4 }, 7),
    ];
    // below again from minute 30: eases at minute 60
    expect(play(steps)).toEqual(['0 ACT NOW utilization', '60 NOTE eased ACT NOW->none']);
  });

  it('update() eases to the level still held, and escalates again from there', () => {
    const steps = [{ utilization: 1.1 }, ...repeat({ utilization: 0.6 }, 7), { utilization: 1.05 }];
    expect(play(steps)).toEqual([
      '0 CRACKING LIKELY utilization',
      '35 NOTE eased CRACKING LIKELY->ACT NOW',
      '40 CRACKING LIKELY utilization',
    ]);
  });

  it('update() repeats an unacknowledged ACT NOW after 30 min of event time, then twice as long each time, while it holds', () => {
    expect(play(repeat({ utilization: 0.6 }, 45))).toEqual([
      '0 ACT NOW utilization',
      '30 ACT NOW utilization repeat',
      '90 ACT NOW utilization repeat',
      '210 ACT NOW utilization repeat',
    ]);
  });

  it('update() repeats every 30 min with renotifyGrowth 1', () => {
    const state = new AlertState(parseAlertOptions({ renotifyGrowth: 1 }));
    expect(play(repeat({ utilization: 0.6 }, 13), state)).toEqual([
      '0 ACT NOW utilization',
      '30 ACT NOW utilization repeat',
      '60 ACT NOW utilization repeat',
    ]);
  });

  it('update() does not repeat an acknowledged notice, nor a PREPARE', () => {
    expect(play(repeat({ utilization: 0.6 }, 13), undefined, () => true)).toEqual([
      '0 ACT NOW utilization',
    ]);
    expect(play(repeat({ probability: 0.5 }, 13))).toEqual(['0 PREPARE margin-outlook']);
  });

  it('update() stops repeating once any notice of the level (the first or a repeat) is acknowledged', () => {
    const acked = new Set<string>();
    const state = new AlertState(DEFAULT_ALERT_OPTIONS);
    const lines = play(repeat({ utilization: 0.6 }, 7), state, (id) => acked.has(id));
    expect(lines).toEqual(['0 ACT NOW utilization', '30 ACT NOW utilization repeat']);
    acked.add('n-6'); // the repeat, sent at step 6
    expect(play(repeat({ utilization: 0.6 }, 14), state, (id) => acked.has(id), 7)).toEqual([]);
    // without the acknowledgement it would have repeated at 90 min (30 + 2 x 30)
    const twin = new AlertState(DEFAULT_ALERT_OPTIONS);
    play(repeat({ utilization: 0.6 }, 7), twin);
    expect(play(repeat({ utilization: 0.6 }, 14), twin, () => false, 7)).toEqual([
      '90 ACT NOW utilization repeat',
    ]);
  });

  it('update() repeats never when renotifyMin is 0', () => {
    const state = new AlertState(parseAlertOptions({ renotifyMin: 0 }));
    expect(play(repeat({ utilization: 0.6 }, 13), state)).toEqual(['0 ACT NOW utilization']);
  });

  it('update() keeps concerns apart: the margin, the drying and a silent probe each notify', () => {
    const silent = { code: 'probe-silent', message: 'probe probe-a/rh-10 silent' };
    expect(
      play([{ probability: 0.5, evaporationKgM2h: 1.2, flags: [silent] }, ...repeat(quiet, 7)]),
    ).toEqual([
      '0 PREPARE evaporation-rate',
      '0 PREPARE margin-outlook',
      '0 NOTE sensor-silent',
      '35 NOTE eased PREPARE->none',
      '35 NOTE eased PREPARE->none',
      '35 NOTE eased NOTE->none',
    ]);
  });

  it('update() ignores a state at or before the last event time taken (a replay)', () => {
    const state = new AlertState(DEFAULT_ALERT_OPTIONS);
    const findings = noticeRules(runState({ utilization: 0.6 }), CONFIG, DEFAULT_ALERT_OPTIONS);
    expect(state.update(findings, T0)).toHaveLength(1);
    expect(state.update(findings, T0)).toEqual([]);
    expect(state.update(findings, T0 - 5 * MIN)).toEqual([]);
  });

  it('a state resumed from its snapshot goes on as if never stopped', () => {
    const steps = [{ probability: 0.5 }, { utilization: 0.6 }, ...repeat({ utilization: 0.4 }, 8)];
    const whole = play(steps);
    const first = new AlertState(DEFAULT_ALERT_OPTIONS);
    const before = play(steps.slice(0, 4), first);
    const resumed = new AlertState(
      DEFAULT_ALERT_OPTIONS,
      JSON.parse(JSON.stringify(first.snapshot())),
    );
    // the resumed state is given the whole run again, as a replay from an older snapshot does
    const after = play(steps, resumed).filter((line) => Number(line.split(' ')[0]) >= 20);
    expect([...before, ...after]).toEqual(whole);
    expect(whole).toEqual([
      '0 PREPARE margin-outlook',
      '5 ACT NOW utilization',
      '40 NOTE eased ACT NOW->none',
    ]);
  });
});
