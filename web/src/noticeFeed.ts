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
 * The notice that sets the level shown at the top of the page: the most urgent one since the
 * latest "eased" notice (which says the condition cleared), the newest among equals. So a NOTE
 * such as "measure logged" after an ACT NOW does not hide the ACT NOW, while an eased notice
 * does. Null when there is none.
 */
export function currentNotice(notices: readonly Notice[]): Notice | null {
  let current: Notice | null = null;
  for (const notice of notices) {
    if (notice.kind === 'eased') return current ?? notice;
    if (current === null || levelRank(notice.level) > levelRank(current.level)) current = notice;
  }
  return current;
}
