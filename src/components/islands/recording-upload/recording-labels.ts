import type { RecordingOutput } from '~/lib/api/recording-schemas';
import { formatClock } from '~/lib/time/format-time';
import type { RecordingStep } from '~/lib/media/recording-lifecycle';

/**
 * How a recording's state reads on the class page. `stalled` is not a server state: it is an
 * `uploading` recording that this window is not sending (cancelled, closed, or another window).
 */
export type StatusKind = RecordingOutput['state'] | 'stalled';

export interface StatusLook {
  label: string;
  /** Tailwind classes for the badge: a tinted background and a text colour with AA contrast. */
  badge: string;
  /** Colour of the progress bar's fill. */
  bar: string;
  icon: 'arrow-up' | 'gear' | 'check' | 'alert' | 'pause';
}

export const STATUS_LOOKS: Record<StatusKind, StatusLook> = {
  uploading: { label: 'Uploading', badge: 'bg-tide/15 text-tide-deep', bar: 'bg-tide', icon: 'arrow-up' },
  processing: { label: 'Processing', badge: 'bg-sun/25 text-ink', bar: 'bg-sun', icon: 'gear' },
  ready: { label: 'Ready', badge: 'bg-mint/10 text-mint-deep', bar: 'bg-mint', icon: 'check' },
  failed: { label: 'Failed', badge: 'bg-error/10 text-error', bar: 'bg-error', icon: 'alert' },
  cancelled: { label: 'Cancelled', badge: 'bg-slate/20 text-ink-soft', bar: 'bg-slate', icon: 'pause' },
  stalled: { label: 'Not finished', badge: 'bg-slate/20 text-ink-soft', bar: 'bg-slate', icon: 'pause' },
};

const STEP_NAMES: Record<RecordingStep, string> = {
  upload: 'Uploading',
  probe: 'Checking the file',
  package: 'Preparing streams',
  'upload-outputs': 'Saving the streams',
};

/** What the coach reads under a cancelled upload. */
export const CANCELLED_NOTE = 'You cancelled this upload. Add the file again to upload it.';

/** The pipeline step in the coach's words. */
export function stepName(step: RecordingStep | null): string {
  return step ? STEP_NAMES[step] : 'Working on it';
}

/** Which look a recording gets, given the recording this window is uploading (if any). */
export function statusKind(rec: Pick<RecordingOutput, 'id' | 'state'>, uploadingHere: string | null): StatusKind {
  if (rec.state === 'uploading' && rec.id !== uploadingHere) return 'stalled';
  return rec.state;
}

/** True while the list can still change without anything this window does. */
export function needsPolling(recs: Pick<RecordingOutput, 'id' | 'state'>[], uploadingHere: string | null): boolean {
  return recs.some((r) => r.state === 'processing' || (r.state === 'uploading' && r.id === uploadingHere));
}

/** File sizes as coaches read them: MB under a gigabyte, GB with one decimal above. */
export function formatSize(bytes: number): string {
  if (bytes >= 1024 ** 3) return `${(bytes / 1024 ** 3).toFixed(1)} GB`;
  if (bytes >= 10 * 1024 ** 2) return `${Math.round(bytes / 1024 ** 2)} MB`;
  if (bytes >= 1024 ** 2) return `${(bytes / 1024 ** 2).toFixed(1)} MB`;
  return `${Math.max(1, Math.round(bytes / 1024))} KB`;
}

/** "1920 × 1080" for a recording with a known frame size. */
export function formatResolution(width: number | null, height: number | null): string | null {
  if (!width || !height) return null;
  return `${width} × ${height}`;
}

/** Length as the design brief asks (m:ss, h:mm:ss from an hour). */
export function formatDuration(seconds: number | null): string | null {
  return seconds == null ? null : formatClock(seconds);
}

/** Percent clamped to 0–100 and rounded, for bars and labels. */
export const clampPercent = (p: number) => Math.max(0, Math.min(100, Math.round(p)));
