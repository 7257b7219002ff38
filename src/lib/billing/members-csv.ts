import type { MemberRow } from '../api/billing-schemas';
import { STATUS_LABEL } from './membership-words';
import { writeCsv } from '../csv/csv-writer';


/** The members table as CSV with a header row; dates as YYYY-MM-DD (UTC). */
export function membersCsv(rows: MemberRow[]): string {
  const day = (iso: string | null) => (iso ? iso.slice(0, 10) : '');
  const lines = [['Name', 'E-mail', 'Status', 'Since', 'Trial end', 'Promo code']];
  for (const r of rows) lines.push([r.name, r.email, STATUS_LABEL[r.status] ?? r.status, day(r.since), day(r.trialEnd), r.promoCode ?? '']);
  return writeCsv(lines);
}
