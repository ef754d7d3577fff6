/** The crew notices of a run page (web/src/noticeFeed.ts): the list and the level on top. */
import { describe, expect, it } from 'vitest';
import type { NoticeKind } from '../../server/src/alerts/types.ts';
import type { Notice, NoticeLevel } from '../../web/src/contract.ts';
import { currentNotice, upsertNotice } from '../../web/src/noticeFeed.ts';

function notice(
  seq: number,
  level: NoticeLevel,
  kind: NoticeKind = 'margin-outlook',
  conditionKey = 'margin',
): Notice {
  return {
    id: `n-r-${seq}`,
    runId: 'r',
    seq,
    level,
    kind,
    conditionKey,
    raisedAtMs: seq * 60_000,
    title: `${level}: notice ${seq}`,
    text: '',
    figures: {
      utilization: null,
      marginMPa: null,
      evaporationKgM2h: null,
      expectedClosingMs: null,
      probabilityCracking: null,
    },
    deliveries: [],
    acknowledgedAtMs: null,
    acknowledgedBy: null,
    repeat: false,
  };
}

describe('upsertNotice()', () => {
  it('adds a new notice on top (newest first)', () => {
    const list = upsertNotice([notice(2, 'NOTE'), notice(1, 'NOTE')], notice(3, 'PREPARE'));
    expect(list.map((entry) => entry.seq)).toEqual([3, 2, 1]);
  });

  it('replaces a known notice (an acknowledgement or delivery) in its place', () => {
    const acked = { ...notice(1, 'ACT NOW'), acknowledgedBy: 'Ana', acknowledgedAtMs: 5 };
    const list = upsertNotice([notice(2, 'NOTE'), notice(1, 'ACT NOW')], acked);
    expect(list.map((entry) => [entry.seq, entry.acknowledgedBy])).toEqual([
      [2, null],
      [1, 'Ana'],
    ]);
  });
});

describe('currentNotice()', () => {
  it.each<[string, Notice[], number | null]>([
    ['no notices: none', [], null],
    ['a single notice: that one', [notice(1, 'PREPARE')], 1],
    [
      'a NOTE on another concern after an ACT NOW does not hide the ACT NOW',
      [notice(3, 'NOTE', 'measure-logged', 'measure'), notice(2, 'ACT NOW'), notice(1, 'PREPARE')],
      2,
    ],
    [
      'a newer notice of the same concern replaces the older one, even when less urgent',
      [notice(3, 'PREPARE'), notice(2, 'ACT NOW')],
      3,
    ],
    [
      "a concern's easing clears its level",
      [notice(3, 'NOTE', 'eased', 'margin'), notice(2, 'ACT NOW', 'margin-outlook', 'margin')],
      3,
    ],
    [
      "one concern's easing leaves another concern's level standing",
      [
        notice(4, 'NOTE', 'eased', 'evaporation'),
        notice(3, 'PREPARE', 'evaporation-rate', 'evaporation'),
        notice(2, 'ACT NOW', 'margin-outlook', 'margin'),
      ],
      2,
    ],
    [
      'the newest wins between equal levels',
      [notice(5, 'PREPARE', 'evaporation-rate', 'evaporation'), notice(4, 'PREPARE')],
      5,
    ],
  ])('%s', (_title, notices, expectedSeq) => {
    expect(currentNotice(notices)?.seq ?? null).toBe(expectedSeq);
  });
});
