/** Verdict and sync-state chips: colour AND a text label (never colour alone), and a shape. */
import { h } from './h';
import type { VerdictLevel } from '../../core/limits';
import { SYNC_STATE_LABEL, type SyncState } from '../offline/types';

export const VERDICT_LABEL: Record<VerdictLevel, string> = { ok: 'OK', warn: 'WARN', alarm: 'ALARM' };
const VERDICT_ICON: Record<VerdictLevel, string> = { ok: '✓', warn: '!', alarm: '▲' };

export function verdictChip(level: VerdictLevel, opts: { big?: boolean } = {}): HTMLElement {
  return h('span', { class: `chip verdict verdict-${level}${opts.big ? ' chip-big' : ''}`, dataset: { verdict: level } },
    h('span', { class: 'chip-icon', 'aria-hidden': 'true' }, VERDICT_ICON[level]), ` ${VERDICT_LABEL[level]}`);
}

export function syncChip(state: SyncState, message?: string | null): HTMLElement {
  const label = state === 'rejected' && message ? `rejected: ${message}` : state === 'conflict' && message ? `conflict: ${message}` : SYNC_STATE_LABEL[state];
  return h('span', { class: `chip sync sync-${state}`, dataset: { sync: state }, title: label }, label);
}

/** Short labels of the server's reading flags (the full message is the chip's title). */
const FLAG_LABEL: Record<string, string> = { 'spot-retired': '⚑ spot retired' };

/**
 * One chip per flag the server put on a reading (e.g. taken offline at a spot
 * that was retired meanwhile): the reading is kept, and the screen says so.
 */
export function flagChips(flags: readonly { code: string; message: string }[], opts: { long?: boolean } = {}): HTMLElement[] {
  return flags.map((f) => h('span', { class: 'chip chip-flag', title: f.message, dataset: { flag: f.code, testid: 'reading-flag' } },
    opts.long ? f.message || f.code : FLAG_LABEL[f.code] ?? f.code));
}
