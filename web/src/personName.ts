/**
 * The name of whoever uses this tablet, for acknowledgements and the measure log: remembered in
 * the browser (localStorage) so the crew lead types it once.
 */

const KEY = 'meniscus.personName';

/** The remembered name, or "" when none (or storage is unavailable). */
export function rememberedName(): string {
  try {
    return localStorage.getItem(KEY) ?? '';
  } catch {
    return '';
  }
}

/** Remembers a name (trimmed); storage failures are ignored (private windows). */
export function rememberName(name: string): void {
  try {
    localStorage.setItem(KEY, name.trim());
  } catch {
    // nothing to do: the name is asked again next time
  }
}
