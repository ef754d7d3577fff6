/**
 * The words the dashboard uses for the engine's codes (vocabulary.md and the trade's own terms):
 * phases, measure kinds and crew notice levels. Pure functions; an unknown code is shown as it
 * came (with dashes as spaces) rather than hidden.
 */
import type { NoticeLevel } from './contract.ts';

const PHASES: Record<string, string> = {
  'before-placement': 'before placement',
  plastic: 'plastic (before final set)',
  hardening: 'hardening (after final set)',
};

/** The engine's phase in words: "plastic" -> "plastic (before final set)". */
export function phaseWords(phase: string): string {
  return PHASES[phase] ?? phase.replaceAll('-', ' ');
}

/** Curing measure kinds the server accepts, in its order (server/src/api/README.md). */
export const MEASURE_KINDS = [
  'wet-covering',
  'ponding',
  'curing-compound',
  'fogging',
  'windbreak',
] as const;

/** A measure kind in words: "wet-covering" -> "wet covering". */
export function measureKindWords(kind: string): string {
  return kind.replaceAll('-', ' ');
}

/** Crew notice levels, least to most urgent (vocabulary.md). */
export const NOTICE_LEVELS: readonly NoticeLevel[] = [
  'NOTE',
  'PREPARE',
  'ACT NOW',
  'CRACKING LIKELY',
];

const LEVEL_MEANING: Record<NoticeLevel, string> = {
  NOTE: 'information',
  PREPARE: 'get protection ready',
  'ACT NOW': 'apply protection now',
  'CRACKING LIKELY': 'utilization at or above 1, now or very soon',
};

/** What a level asks of the crew, e.g. "ACT NOW" -> "apply protection now" (vocabulary.md). */
export function levelMeaning(level: string): string {
  return LEVEL_MEANING[level as NoticeLevel] ?? 'crew notice';
}

/**
 * CSS class suffix of a level ("act-now"); the level is always also written out, colour is
 * never its only sign.
 */
export function levelClass(level: string): string {
  return level.toLowerCase().replaceAll(' ', '-');
}
