import { compareWithAdvertised } from '~/lib/plan/advertised-length';
import { formatLength } from '~/lib/time/format-time';

/**
 * The planned total next to the advertised length and the recording's length, judged with the
 * same ±% rule the timing check uses.
 */
export default function PlanLengths(p: { plannedSeconds: number | null; advertisedMinutes: number; recordingSeconds: number | null; percent: number }) {
  const vsAdvertised = p.plannedSeconds === null ? null : compareWithAdvertised(p.plannedSeconds, p.advertisedMinutes, p.percent);
  const recordingShort = p.plannedSeconds !== null && p.recordingSeconds !== null && p.recordingSeconds + 0.0005 < p.plannedSeconds;
  return (
    <div className="flex flex-col gap-1" aria-live="polite">
      <dl className="flex flex-wrap gap-x-6 gap-y-1 text-sm">
        <div className="flex gap-2"><dt className="font-semibold">Planned</dt><dd className="tabular" data-planned-total>{p.plannedSeconds === null ? '—' : formatLength(p.plannedSeconds)}</dd></div>
        <div className="flex gap-2"><dt className="font-semibold">Advertised</dt><dd className="tabular">{p.advertisedMinutes} min (±{p.percent} %)</dd></div>
        <div className="flex gap-2"><dt className="font-semibold">Recording</dt><dd className="tabular">{p.recordingSeconds === null ? 'none yet' : formatLength(p.recordingSeconds)}</dd></div>
      </dl>
      {p.plannedSeconds === null && <p className="text-sm text-ink-soft">The total shows once every field is filled in.</p>}
      {vsAdvertised && !vsAdvertised.within && (
        <p className="text-sm font-semibold text-warning" data-length-warning>
          The plan adds up to {formatLength(p.plannedSeconds!)}, outside {p.advertisedMinutes} min ± {p.percent} %: the check will warn until the plan or the advertised length changes.
        </p>
      )}
      {vsAdvertised?.within && <p className="text-sm text-mint-deep" data-length-ok>Within the advertised length.</p>}
      {recordingShort && (
        <p className="text-sm font-semibold text-warning">The recording is shorter than the plan ({formatLength(p.recordingSeconds!)}).</p>
      )}
    </div>
  );
}
