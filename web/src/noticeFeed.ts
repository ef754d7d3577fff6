/**
 * The crew notices a run page shows: the list from GET /api/runs/:id/notices, updated by the
 * `notice` socket event (a new notice, or a known one with a new delivery or acknowledgement).
 * Newest first, as the server answers. Pure functions.
 */
import type { Notice } from './contract.ts';
import { NOTICE_LEVELS } from './words.ts';

const levelRank = (level: string): number => NOTICE_LEVELS.indexOf(level as Notice['level']);

/** Adds a notice or replaces the one with its id; newest (highest seq) first. */
export function upsertNotice(notices: readonly Notice[], notice: Notice): Notice[] {
  const others = notices.filter((entry) => entry.id !== notice.id);
  return [...others, notice].sort((a, b) => b.seq - a.seq);
}

/**
 * The notice that sets the level shown at the top of the page. The server keeps one level per
 * concern (`conditionKey`: the margin, the evaporation, a silent sensor...), so the page takes the
 * newest notice of each concern (an "eased" one included: it says that concern cleared or
 * dropped) and shows the most urgent of those, the newest among equals. A NOTE such as "measure
 * logged" thus never hides an ACT NOW on the margin, while the margin's own easing does. Null
 * when there is no notice.
 */
export function currentNotice(notices: readonly Notice[]): Notice | null {
  const newestPerConcern = new Map<string, Notice>();
  for (const notice of notices) {
    const concern = notice.conditionKey;
    const known = newestPerConcern.get(concern);
    if (known === undefined || notice.seq > known.seq) newestPerConcern.set(concern, notice);
  }
  let current: Notice | null = null;
  for (const notice of newestPerConcern.values()) {
    if (
      current === null ||
      levelRank(notice.level) > levelRank(current.level) ||
      (levelRank(notice.level) === levelRank(current.level) && notice.seq > current.seq)
    )
      current = notice;
  }
  return current;
}
