/**
 * The live link's status in the top bar, in words: a page that stopped updating must say so,
 * or a crew lead reads old figures as current.
 */

const WORDS = {
  live: 'Live: updates as readings arrive',
  connecting: 'Connecting...',
  reconnecting: 'Connection lost: reconnecting. Figures may be out of date.',
  offline: 'Not live',
} as const;

/** Writes the status into the top bar's #connection element. */
export function showConnection(status: keyof typeof WORDS, detail?: string): void {
  const target = document.getElementById('connection');
  if (target === null) return;
  target.textContent = detail === undefined ? WORDS[status] : `${WORDS[status]}: ${detail}`;
  target.dataset.status = status;
}
