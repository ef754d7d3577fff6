import { describe, expect, it } from 'vitest';
import { validationIssues as issuesOf } from '../helpers/validationIssues.ts';
import { parseMeasureEnd, parseMeasureStart } from '../../server/src/runs/measureInput.ts';

const NOW_MS = Date.parse('2026-06-14T14:00:00+02:00');

describe('parseMeasureStart()', () => {
  it('defaults the start to now and the end to still applied', () => {
    expect(parseMeasureStart({ kind: 'ponding', loggedBy: 'crew lead' }, NOW_MS)).toEqual({
      kind: 'ponding',
      startMs: NOW_MS,
      endMs: null,
      loggedBy: 'crew lead',
    });
  });

  it('takes a measure logged after the fact with its end, efficiency and note', () => {
    const parsed = parseMeasureStart(
      {
        kind: 'curing-compound',
        startAt: '2026-06-14T12:00:00+02:00',
        endAt: '2026-06-14T13:00:00Z',
        loggedBy: 'A. Site',
        efficiency: 0.8,
        note: 'sprayed by hand',
      },
      NOW_MS,
    );
    expect(parsed).toEqual({
      kind: 'curing-compound',
      startMs: Date.parse('2026-06-14T10:00:00Z'),
      endMs: Date.parse('2026-06-14T13:00:00Z'),
      loggedBy: 'A. Site',
      efficiency: 0.8,
      note: 'sprayed by hand',
    });
  });

  it('takes fogging with its humidity and a windbreak with its wind factor', () => {
    expect(
      parseMeasureStart({ kind: 'fogging', loggedBy: 'x', relativeHumidity: 0.95 }, NOW_MS),
    ).toMatchObject({ kind: 'fogging', relativeHumidity: 0.95 });
    expect(
      parseMeasureStart({ kind: 'windbreak', loggedBy: 'x', windFactor: 0.4 }, NOW_MS),
    ).toMatchObject({ kind: 'windbreak', windFactor: 0.4 });
  });

  it.each([
    [
      { kind: 'ponding', loggedBy: 'x', windFactor: 0.4 },
      'windFactor applies to windbreak only: got it for ponding',
    ],
    [
      { kind: 'fogging', loggedBy: 'x', relativeHumidity: 95 },
      'relativeHumidity must be at most 1: got 95',
    ],
    [
      { loggedBy: 'x' },
      'kind must be one of wet-covering, ponding, curing-compound, fogging, windbreak: got nothing',
    ],
    [
      { kind: 'tarp', loggedBy: 'x' },
      'kind must be one of wet-covering, ponding, curing-compound, fogging, windbreak: got "tarp"',
    ],
    [{ kind: 'ponding' }, 'loggedBy is required: got nothing'],
    [{ kind: 'ponding', loggedBy: '  ' }, 'loggedBy must not be empty: got "  "'],
    [
      { kind: 'ponding', loggedBy: 'x', startAt: '2026-06-14T12:00:00' },
      'startAt must be an ISO 8601 date and time with an offset, e.g. 2026-06-14T13:40:00+02:00: got "2026-06-14T12:00:00"',
    ],
    [
      { kind: 'curing-compound', loggedBy: 'x', efficiency: 1.5 },
      'efficiency must be at most 1: got 1.5',
    ],
    [
      { kind: 'ponding', loggedBy: 'x', efficiency: 0.5 },
      'efficiency applies to curing-compound only: got it for ponding',
    ],
    [
      {
        kind: 'ponding',
        loggedBy: 'x',
        startAt: '2026-06-14T12:00:00Z',
        endAt: '2026-06-14T11:00:00Z',
      },
      'endAt must not be before startAt (2026-06-14T12:00:00.000Z): got 2026-06-14T11:00:00Z',
    ],
    [
      { kind: 'ponding', loggedBy: 'x', colour: 'red' },
      'configuration has unknown field(s) colour',
    ],
  ])('rejects %j naming the field', (body, issue) => {
    expect(issuesOf(() => parseMeasureStart(body, NOW_MS))).toContain(issue);
  });
});

describe('parseMeasureEnd()', () => {
  it('defaults the end to now', () => {
    expect(parseMeasureEnd({ endedBy: 'foreman' }, NOW_MS)).toEqual({
      endMs: NOW_MS,
      endedBy: 'foreman',
    });
  });

  it.each([
    [{}, 'endedBy is required: got nothing'],
    [
      { endedBy: 'x', endAt: 'soon' },
      'endAt must be an ISO 8601 date and time with an offset, e.g. 2026-06-14T13:40:00+02:00: got "soon"',
    ],
  ])('rejects %j naming the field', (body, issue) => {
    expect(issuesOf(() => parseMeasureEnd(body, NOW_MS))).toContain(issue);
  });
});
