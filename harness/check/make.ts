/** Building check results: a ran check from a comparison, a skipped one from the reason it could not run. */
import type { Comparison } from '../compare/index.js';
import type { CheckKind, CheckResult } from './types.js';

export interface CheckHead {
  readonly kind: CheckKind;
  readonly name: string;
  readonly methods: readonly string[];
  readonly independent: boolean;
}

export function ran(head: CheckHead, c: Comparison, detail: string): CheckResult {
  return { ...head, status: c.agree ? 'passed' : 'failed', ratio: c.ratio, detail };
}

export function failed(head: CheckHead, detail: string): CheckResult {
  return { ...head, status: 'failed', detail };
}

export function skipped(head: CheckHead, reason: string): CheckResult {
  return { ...head, status: 'skipped', detail: reason };
}
