import { useState, useSyncExternalStore } from 'react';
import type { RecordingOutput } from '~/lib/api/recording-schemas';
import { formatClock } from '~/lib/time/format-time';
import {
  CANCELLED_NOTE,
  clampPercent,
  formatDuration,
  formatResolution,
  formatSize,
  STATUS_LOOKS,
  statusKind,
  stepName,
  type StatusLook,
} from './recording-labels';

/** The upload running in this window, as the browser measures it. */
export interface UploadingHere {
  recordingId: string;
  percent: number;
  bytesUploaded: number;
  bytesTotal: number;
  /** Average speed since the upload started; null until there is enough to tell. */
  bytesPerSecond: number | null;
  secondsLeft: number | null;
  /** Sending parts, paused by the coach, or sent and being handed over for processing. */
  phase: 'sending' | 'paused' | 'stopped' | 'handing-over';
}

interface Props {
  recordings: RecordingOutput[];
  uploadingHere: UploadingHere | null;
  onRetry: (recordingId: string) => Promise<void>;
}

/** Recordings of the class with their state in words, colour and icon (never colour alone). */
export default function RecordingStatusList({ recordings, uploadingHere, onRetry }: Props) {
  if (recordings.length === 0) {
    return <p className="text-ink-soft">No recording yet. When you add one, its progress shows here.</p>;
  }
  return (
    <ul className="flex flex-col gap-3" aria-label="Recordings of this class">
      {recordings.map((rec) => (
        <RecordingItem key={rec.id} rec={rec} uploadingHere={uploadingHere} onRetry={onRetry} />
      ))}
    </ul>
  );
}

function RecordingItem({ rec, uploadingHere, onRetry }: { rec: RecordingOutput } & Omit<Props, 'recordings'>) {
  const online = useOnline();
  const mine = uploadingHere?.recordingId === rec.id ? uploadingHere : null;
  // Offline, the widget holds the upload until the connection is back (see recording-uppy.ts).
  const here = mine?.phase === 'sending' && !online ? { ...mine, phase: 'stopped' as const } : mine;
  const kind = statusKind(rec, here ? rec.id : null);
  const look = STATUS_LOOKS[kind];
  const percent = clampPercent(kind === 'uploading' ? (here?.percent ?? rec.progress) : rec.progress);
  const length = formatDuration(rec.durationSeconds);
  const resolution = formatResolution(rec.width, rec.height);

  return (
    <li className="rounded-[10px] border border-stone/70 bg-paper/60 p-4" data-recording-id={rec.id} data-state={kind}>
      <div className="flex flex-wrap gap-4">
        {rec.state === 'ready' && rec.posterUrl && (
          <img
            src={rec.posterUrl}
            alt={`Poster frame of ${rec.fileName}`}
            className="aspect-video w-44 shrink-0 rounded-[4px] bg-ink object-cover"
            loading="lazy"
          />
        )}
        <div className="flex min-w-0 flex-1 flex-col gap-2">
          <div className="flex flex-wrap items-center gap-2">
            <StatusBadge look={look} />
            {rec.isCurrent && (
              <span className="inline-flex items-center gap-1 rounded-full bg-ink px-2 py-0.5 text-sm font-bold text-paper">
                <StarIcon /> Used for this class
              </span>
            )}
            <span className="min-w-0 truncate font-semibold" title={rec.fileName}>
              {rec.fileName}
            </span>
            <span className="tabular text-sm text-ink-soft">{formatSize(rec.sizeBytes)}</span>
          </div>

          {(kind === 'uploading' || kind === 'processing') && (
            <ProgressBar
              key={kind}
              label={kind === 'uploading' ? UPLOAD_PHASES[here?.phase ?? 'sending'] : stepName(rec.step)}
              percent={percent}
              look={look}
              detail={here?.phase === 'sending' && here.bytesPerSecond ? uploadDetail(here) : null}
            />
          )}

          {kind === 'processing' && rec.retryReason && (
            <p className="text-sm text-warning" data-retry-reason>
              {rec.retryReason}
            </p>
          )}

          {kind === 'stalled' && (
            <p className="text-sm text-ink-soft">
              This upload stopped before it finished: it was cancelled, the page was closed, or it is still running in
              another window. To use this file, add it again above.
            </p>
          )}

          {rec.state === 'ready' && (
            <dl className="flex flex-wrap gap-x-6 gap-y-1 text-sm">
              {length && (
                <div className="flex gap-1">
                  <dt className="text-ink-soft">Length</dt>
                  <dd className="tabular font-semibold">{length}</dd>
                </div>
              )}
              {resolution && (
                <div className="flex gap-1">
                  <dt className="text-ink-soft">Picture</dt>
                  <dd className="tabular font-semibold">{resolution}</dd>
                </div>
              )}
              {!rec.isCurrent && (
                <div className="text-ink-soft">An earlier recording; members see the one marked above.</div>
              )}
            </dl>
          )}

          {rec.state === 'failed' && <FailedNote rec={rec} onRetry={onRetry} />}
          {rec.state === 'cancelled' && <p className="text-sm text-ink-soft">{CANCELLED_NOTE}</p>}

          {rec.warnings.length > 0 && (
            <ul className="flex flex-col gap-1 text-sm" aria-label="Things to check">
              {rec.warnings.map((w) => (
                <li key={w} className="flex items-start gap-1.5 text-warning">
                  <WarningIcon />
                  <span>{w}</span>
                </li>
              ))}
            </ul>
          )}
        </div>
      </div>
    </li>
  );
}

function StatusBadge({ look }: { look: StatusLook }) {
  return (
    <span className={`inline-flex items-center gap-1 rounded-full px-2 py-0.5 text-sm font-bold ${look.badge}`} data-status-label>
      <StatusIcon icon={look.icon} />
      {look.label}
    </span>
  );
}

const onOnlineChange = (onChange: () => void) => {
  window.addEventListener('online', onChange);
  window.addEventListener('offline', onChange);
  return () => {
    window.removeEventListener('online', onChange);
    window.removeEventListener('offline', onChange);
  };
};

/** Whether the browser says it is online, following its online and offline events. */
function useOnline(): boolean {
  return useSyncExternalStore(onOnlineChange, () => navigator.onLine, () => true);
}

const UPLOAD_PHASES: Record<UploadingHere['phase'], string> = {
  sending: 'Uploading',
  paused: 'Paused: press resume to carry on',
  stopped: 'Stopped: carries on from the last finished part',
  'handing-over': 'Uploaded, handing over for processing',
};

/** "3.2 MB of 8.7 MB · 1.1 MB/s · about 0:05 left" */
function uploadDetail({ bytesUploaded, bytesTotal, bytesPerSecond, secondsLeft }: UploadingHere): string {
  const parts = [`${formatSize(bytesUploaded)} of ${formatSize(bytesTotal)}`, `${formatSize(bytesPerSecond ?? 0)}/s`];
  if (secondsLeft != null) parts.push(`about ${formatClock(Math.max(1, secondsLeft))} left`);
  return parts.join(' · ');
}

function ProgressBar({ label, percent, look, detail }: { label: string; percent: number; look: StatusLook; detail?: string | null }) {
  return (
    <div className="flex flex-col gap-1">
      <div className="flex flex-wrap justify-between gap-x-3 text-sm">
        <span className="font-semibold" data-step>
          {label}
        </span>
        <span className="tabular text-ink-soft">
          {detail && <span data-upload-speed>{detail}</span>}
          <span className="ml-3 font-semibold text-ink" data-percent>
            {percent} %
          </span>
        </span>
      </div>
      <div
        role="progressbar"
        aria-label={label}
        aria-valuemin={0}
        aria-valuemax={100}
        aria-valuenow={percent}
        className="h-2.5 overflow-hidden rounded-full bg-stone/40"
      >
        <div className={`h-full rounded-full transition-[width] duration-500 ${look.bar}`} style={{ width: `${percent}%` }} />
      </div>
    </div>
  );
}

function FailedNote({ rec, onRetry }: { rec: RecordingOutput; onRetry: Props['onRetry'] }) {
  const [busy, setBusy] = useState(false);
  const [message, setMessage] = useState<string | null>(null);
  return (
    <div className="flex flex-col gap-2">
      <p className="font-semibold text-error" data-failure-reason>
        {rec.failureReason ?? 'Processing stopped without a reason. Retry, or upload the file again.'}
      </p>
      {rec.canRetry && (
      <div className="flex flex-wrap items-center gap-3">
        <button
          type="button"
          disabled={busy}
          onClick={async () => {
            setBusy(true);
            setMessage(null);
            try {
              await onRetry(rec.id);
            } catch (err) {
              setMessage(err instanceof Error ? err.message : 'That did not work. Please try again.');
            } finally {
              setBusy(false);
            }
          }}
          className="rounded-[10px] bg-ink px-4 py-1.5 font-bold text-paper disabled:opacity-60"
        >
          {busy ? 'Retrying…' : 'Retry'}
        </button>
        {message && (
          <p role="alert" className="text-sm font-semibold text-error">
            {message}
          </p>
        )}
      </div>
      )}
    </div>
  );
}

const iconProps = { width: 16, height: 16, viewBox: '0 0 16 16', 'aria-hidden': true, fill: 'none', stroke: 'currentColor', strokeWidth: 2, strokeLinecap: 'round', strokeLinejoin: 'round' } as const;

function StatusIcon({ icon }: { icon: StatusLook['icon'] }) {
  switch (icon) {
    case 'arrow-up':
      return (
        <svg {...iconProps}>
          <path d="M8 13V3M3.5 7.5 8 3l4.5 4.5" />
        </svg>
      );
    case 'gear':
      return (
        <svg {...iconProps} className="motion-safe:animate-spin">
          <path d="M8 1.5v2.2M8 12.3v2.2M1.5 8h2.2M12.3 8h2.2M3.4 3.4 5 5M11 11l1.6 1.6M3.4 12.6 5 11M11 5l1.6-1.6" />
        </svg>
      );
    case 'check':
      return (
        <svg {...iconProps}>
          <path d="M3 8.5 6.5 12 13 4.5" />
        </svg>
      );
    case 'alert':
      return (
        <svg {...iconProps}>
          <circle cx="8" cy="8" r="6.5" />
          <path d="M8 4.5v4M8 11.2v.3" />
        </svg>
      );
    case 'pause':
      return (
        <svg {...iconProps}>
          <path d="M5.5 3.5v9M10.5 3.5v9" />
        </svg>
      );
  }
}

function WarningIcon() {
  return (
    <svg {...iconProps} className="mt-1 shrink-0">
      <path d="M8 2 14.5 13.5h-13Z" />
      <path d="M8 6.5v3M8 11.6v.2" />
    </svg>
  );
}

function StarIcon() {
  return (
    <svg {...iconProps} fill="currentColor" strokeWidth={1}>
      <path d="M8 1.8 9.9 5.9l4.4.5-3.3 3 .9 4.4L8 11.6l-3.9 2.2.9-4.4-3.3-3 4.4-.5Z" />
    </svg>
  );
}
