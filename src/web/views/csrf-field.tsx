/** The hidden field with the request's CSRF token; every form that posts includes it (middleware/csrf.ts checks it). */
import { requestState } from './request-state.js';

export const CSRF_FIELD = '_csrf';
/** The header htmx sends the same token in (hx-headers on the body, set in Layout). */
export const CSRF_HEADER = 'X-CSRF-Token';

export function CsrfField() {
  const { csrfToken } = requestState();
  return csrfToken ? <input type="hidden" name={CSRF_FIELD} value={csrfToken} /> : null;
}
