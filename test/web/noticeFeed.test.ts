/** The crew notices of a run page (web/src/noticeFeed.ts): the list and the level on top. */
import { describe, expect, it } from 'vitest';
import type { Notice, NoticeLevel } from '../../web/src/contract.ts';
import { currentNotice, upsertNotice } from '../../web/src/noticeFeed.ts';

function notice(seq: number, level: NoticeLevel, kind = 'margin-outlook'): Notice {
  return {
    id: `n-r-${seq}`,
    runId: 'r',
    seq,
    level,
    kind,
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
      'a NOTE after an ACT NOW does not hide the ACT NOW',
      [notice(3, 'NOTE', 'measure-logged'), notice(2, 'ACT NOW'), notice(1, 'PREPARE')],
      2,
    ],
    [
      'a more urgent newer notice replaces an older one',
      [notice(3, 'CRACKING LIKELY'), notice(2, 'ACT NOW')],
      3,
    ],
    [
      'an eased notice clears the earlier levels',
      [notice(3, 'NOTE', 'eased'), notice(2, 'ACT NOW')],
      3,
    ],
    [
      'levels raised after an eased notice count, the ones before it do not',
      [notice(4, 'PREPARE'), notice(3, 'NOTE', 'eased'), notice(2, 'CRACKING LIKELY')],
      4,
    ],
  ])('%s', (_title, notices, expectedSeq) => {
    expect(currentNotice(notices)?.seq ?? null).toBe(expectedSeq);
  });
});
