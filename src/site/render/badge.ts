/**
 * Status and verdict badges: a mark and a word, each status with its own
 * shape (set in site.css), so no badge is told apart by colour alone.
 * Shared by pages and the browser script.
 */
import type { ModelStatus } from '../../catalogue/records/model-record.ts';
import type { VerdictOutcome } from '../../catalogue/verify/verdict.ts';
import { OUTCOME_LABEL, OUTCOME_MEANING, STATUS_LABEL, STATUS_MEANING } from '../../catalogue/vocabulary.ts';
import { escapeHtml } from './escape.ts';

const STATUS_MARK: Record<ModelStatus, string> = {
  verified: '✓',
  disputed: '✗',
  unsettled: '?',
  'portrait-only': '○',
  invalid: '⊘',
  failed: '!',
};

const OUTCOME_MARK: Record<VerdictOutcome, string> = { confirmed: '✓', contradicted: '✗', unsettled: '?' };

export function statusBadgeHtml(status: ModelStatus): string {
  return `<span class="badge badge-${status}" data-status="${status}" title="${escapeHtml(STATUS_MEANING[status])}"><span class="badge-mark" aria-hidden="true">${STATUS_MARK[status]}</span>${escapeHtml(STATUS_LABEL[status])}</span>`;
}

export function outcomeBadgeHtml(outcome: VerdictOutcome): string {
  return `<span class="verdict verdict-${outcome}" title="${escapeHtml(OUTCOME_MEANING[outcome])}"><span class="badge-mark" aria-hidden="true">${OUTCOME_MARK[outcome]}</span>${OUTCOME_LABEL[outcome]}</span>`;
}
