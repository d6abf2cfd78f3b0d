// Missing safety content is tolerated while a procedure is drafted and blocks it from review on.
import type { Severity } from '../parse/diagnostic.ts';

/** Source: OSHA 29 CFR 1910.119(f)(1) asks for this content in procedures in use; a draft may still be incomplete. */
export function contentSeverity(status: string): Severity {
  return status === 'draft' ? 'warning' : 'error';
}
