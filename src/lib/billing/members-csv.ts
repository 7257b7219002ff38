import type { MemberRow } from '../api/billing-schemas';
import { STATUS_LABEL } from './membership-words';

/**
 * One CSV cell (RFC 4180 quoting). Cells that a spreadsheet would run as a formula get a
 * leading apostrophe (OWASP "CSV Injection"), since names and e-mails are typed by members.
 */
export function csvCell(value: string | null | undefined): string {
  let v = value ?? '';
  if (/^[=+\-@\t\r]/.test(v)) v = `'${v}`;
  return /[",\r\n]/.test(v) ? `"${v.replace(/"/g, '""')}"` : v;
}

/** The members table as CSV with a header row; dates as YYYY-MM-DD (UTC). */
export function membersCsv(rows: MemberRow[]): string {
  const day = (iso: string | null) => (iso ? iso.slice(0, 10) : '');
  const lines = [['Name', 'E-mail', 'Status', 'Since', 'Trial end', 'Promo code']];
  for (const r of rows) lines.push([r.name, r.email, STATUS_LABEL[r.status] ?? r.status, day(r.since), day(r.trialEnd), r.promoCode ?? '']);
  return lines.map((l) => l.map(csvCell).join(',')).join('\r\n') + '\r\n';
}
