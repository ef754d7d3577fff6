/** The dashboard's addresses (web/src/route.ts). */
import { describe, expect, it } from 'vitest';
import { runIdOfPath } from '../../web/src/route.ts';

describe('runIdOfPath()', () => {
  it.each<[string, string | null]>([
    ['/runs/3ce6f363-035c', '3ce6f363-035c'],
    ['/runs/abc/', 'abc'],
    ['/runs/a%20b', 'a b'],
    ['/', null],
    ['/runs/', null],
    ['/runs/abc/state', null],
    ['/runs/%E0%A4%A', null],
  ])('runIdOfPath(%j) is %j', (path, expected) => {
    expect(runIdOfPath(path)).toBe(expected);
  });
});
