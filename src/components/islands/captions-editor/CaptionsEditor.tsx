import '../zod-without-eval'; // first: before any schema is built
import { useCallback, useEffect, useId, useState } from 'react';
import { captionsPastRecording, trimCaptionsToRecording, type CaptionCue, type CaptionsOutput, type CaptionsSavedOutput } from '~/lib/captions/caption-schema';
import { formatPreciseTime, parseTime } from '~/lib/time/format-time';
import { ApiError, apiCall } from '../api-client';
import { toolButton } from '../timeline-editor/tool-button';
import { CaptionRow, type CueDraft } from './CaptionRow';

const toDraft = (c: CaptionCue): CueDraft => ({ start: formatPreciseTime(c.startSeconds), end: formatPreciseTime(c.endSeconds), text: c.text });

/** The drafts as cues to save, or the first typed time that is not a time (with its field key). */
function toCues(drafts: CueDraft[]): { cues: CaptionCue[] } | { field: string; message: string } {
  const cues: CaptionCue[] = [];
  for (const [i, d] of drafts.entries()) {
    const start = parseTime(d.start);
    if (!start.ok) return { field: `cues.${i}.startSeconds`, message: start.message };
    const end = parseTime(d.end);
    if (!end.ok) return { field: `cues.${i}.endSeconds`, message: end.message };
    cues.push({ startSeconds: start.seconds, endSeconds: end.seconds, text: d.text });
  }
  return { cues };
}

type Status = { kind: 'idle' } | { kind: 'saved'; message: string } | { kind: 'error'; message: string; stale?: boolean };

/**
 * The class's captions beside its timeline: upload a WebVTT or SubRip file, read and edit each
 * caption's times and text, remove one or all. Every change is saved whole with the version it
 * was read at (PUT /api/lessons/{id}/captions); a save someone else overtook answers 409.
 */
export default function CaptionsEditor({ lessonId }: { lessonId: string }) {
  const fileId = useId();
  const [loaded, setLoaded] = useState<CaptionsOutput | null>(null);
  const [drafts, setDrafts] = useState<CueDraft[]>([]);
  const [language, setLanguage] = useState('en');
  const [label, setLabel] = useState('English captions');
  const [fields, setFields] = useState<Record<string, string>>({});
  const [status, setStatus] = useState<Status>({ kind: 'idle' });
  const [confirmRemoveAll, setConfirmRemoveAll] = useState(false);
  const [busy, setBusy] = useState(false);
  const path = `/api/lessons/${lessonId}/captions`;

  const apply = useCallback((c: CaptionsOutput) => {
    setLoaded(c);
    setDrafts(c.cues.map(toDraft));
    setLanguage(c.language);
    setLabel(c.label);
    // Captions saved against a longer recording than the current one: each says so at its end time.
    setFields(c.recordingSeconds === null ? {} : captionsPastRecording(c.cues, c.recordingSeconds));
  }, []);
  const load = useCallback(() => apiCall<CaptionsOutput>('GET', path).then(apply), [path, apply]);

  useEffect(() => {
    let cancelled = false;
    apiCall<CaptionsOutput>('GET', path).then(
      (c) => !cancelled && apply(c),
      (err: unknown) => !cancelled && setStatus({ kind: 'error', message: err instanceof Error ? err.message : String(err) }),
    );
    return () => {
      cancelled = true;
    };
  }, [path, apply]);

  const fail = (err: unknown) => {
    if (err instanceof ApiError) {
      setFields(err.fields ?? {});
      setStatus({ kind: 'error', message: err.message, stale: err.status === 409 });
    } else setStatus({ kind: 'error', message: err instanceof Error ? err.message : String(err) });
  };

  const run = async (action: () => Promise<string>) => {
    setBusy(true);
    setStatus({ kind: 'idle' });
    try {
      const message = await action();
      await load();
      setStatus({ kind: 'saved', message });
    } catch (err) {
      fail(err);
    } finally {
      setBusy(false);
      setConfirmRemoveAll(false);
    }
  };

  const save = (list: CueDraft[], what: string) =>
    run(async () => {
      const parsed = toCues(list);
      if ('field' in parsed) throw new ApiError(parsed.message, 400, 'invalid_input', { [parsed.field]: parsed.message });
      await apiCall<CaptionsSavedOutput>('PUT', path, { version: loaded!.version, language, label, cues: parsed.cues });
      return what;
    });

  const upload = (file: File | undefined) => {
    if (!file) return;
    void run(async () => {
      const query = new URLSearchParams({ version: String(loaded!.version), language, label });
      try {
        const saved = await apiCall<CaptionsSavedOutput>('POST', `${path}/import?${query}`, file, {
          offlineMessage: 'We could not reach Roundmark. Check your connection, then upload the file again.',
        });
        return `${file.name}: ${saved.cues} caption${saved.cues === 1 ? '' : 's'} saved.`;
      } catch (err) {
        // Whatever is wrong with the file (or a caption in it) is said at the file field.
        if (err instanceof ApiError && err.status !== 409) throw new ApiError(`${file.name}: ${err.message}`, err.status, err.code, { file: `${file.name}: ${err.message}` });
        throw err;
      }
    });
  };

  /** The fix for captions past the end of a newer, shorter recording. */
  const trim = () => {
    const parsed = toCues(drafts);
    if ('field' in parsed || loaded?.recordingSeconds == null) return void save(drafts, 'Captions saved.');
    const end = loaded.recordingSeconds;
    const kept = trimCaptionsToRecording(parsed.cues, end);
    const shortened = parsed.cues.filter((c) => c.startSeconds < end && c.endSeconds > end).length;
    void save(kept.map(toDraft), `Captions trimmed to the recording: ${parsed.cues.length - kept.length} removed, ${shortened} shortened.`);
  };

  if (!loaded) return <p className="text-ink-soft">{status.kind === 'error' ? status.message : 'Loading captions…'}</p>;
  const noRecording = loaded.recordingSeconds === null;
  const pastEnd = Object.keys(fields).filter((k) => /^cues\.\d+\.endSeconds$/.test(k) && /after the recording/.test(fields[k]!)).length;

  return (
    <div className="flex flex-col gap-4" data-captions-editor>
      <p className="text-sm text-ink-soft">
        The words spoken in the class, and sounds that matter (“[beep]”), for members who are deaf or hard of hearing or follow with the sound off.
        Members get them with the next publish.
        {noRecording && ' Captions are timed against the recording: upload it and wait until it is ready first.'}
      </p>
      <div className="grid gap-3 sm:grid-cols-[auto_auto_1fr] sm:items-end">
        <div className="flex flex-col gap-1">
          <label htmlFor={`${fileId}-lang`} className="font-semibold">Language</label>
          <input id={`${fileId}-lang`} value={language} onChange={(e) => setLanguage(e.target.value)} className="w-28 rounded-[10px] border border-slate bg-chalk px-3 py-2" aria-describedby={fields.language ? `${fileId}-lang-error` : undefined} />
          {fields.language && <p id={`${fileId}-lang-error`} className="text-sm text-error">{fields.language}</p>}
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor={`${fileId}-label`} className="font-semibold">Name members see</label>
          <input id={`${fileId}-label`} value={label} onChange={(e) => setLabel(e.target.value)} className="rounded-[10px] border border-slate bg-chalk px-3 py-2" aria-describedby={fields.label ? `${fileId}-label-error` : undefined} />
          {fields.label && <p id={`${fileId}-label-error`} className="text-sm text-error">{fields.label}</p>}
        </div>
        <div className="flex flex-col gap-1">
          <label htmlFor={fileId} className="font-semibold">Caption file (.vtt or .srt)</label>
          <input
            id={fileId}
            type="file"
            accept=".vtt,.srt,text/vtt,application/x-subrip"
            disabled={busy}
            className="text-sm"
            aria-describedby={fields.file ? `${fileId}-file-error` : undefined}
            onChange={(e) => {
              upload(e.target.files?.[0]);
              e.target.value = '';
            }}
          />
          {fields.file && <p id={`${fileId}-file-error`} role="alert" className="text-sm font-semibold text-error" data-file-error>{fields.file}</p>}
        </div>
      </div>
      {pastEnd > 0 && loaded.recordingSeconds !== null && (
        <div className="rounded-[10px] border border-warning/50 bg-warning/5 p-3" data-captions-past-end>
          <p className="font-semibold">
            {pastEnd} caption{pastEnd === 1 ? ' ends' : 's end'} after the recording, which is now {formatPreciseTime(loaded.recordingSeconds)} long. Members would read
            them after the video has ended, so the class cannot be published until they fit.
          </p>
          <button type="button" className={`${toolButton} mt-2`} disabled={busy} onClick={trim}>
            Trim to the recording
          </button>
        </div>
      )}
      {status.kind === 'saved' && <p role="status" className="rounded-[10px] bg-mint/10 p-3 font-semibold text-mint-deep">{status.message}</p>}
      {status.kind === 'error' && !fields.file && (
        <div role="alert" className="rounded-[10px] bg-error/10 p-3 font-semibold text-error">
          {status.message}
          {status.stale && (
            <button type="button" className={`${toolButton} ml-2`} onClick={() => void load().then(() => setStatus({ kind: 'idle' }))}>
              Reload the captions
            </button>
          )}
        </div>
      )}
      <h3 className="text-lg">
        Captions in this class <span className="tabular text-ink-soft">({drafts.length})</span>
      </h3>
      {drafts.length === 0 ? (
        <p className="text-ink-soft">No captions yet. Upload a caption file to start.</p>
      ) : (
        <ol className="flex max-h-[32rem] flex-col gap-2 overflow-y-auto pr-1" aria-label="Captions" tabIndex={0}>
          {drafts.map((d, i) => (
            <CaptionRow
              key={i}
              index={i}
              draft={d}
              fields={fields}
              disabled={busy}
              onChange={(next) => setDrafts((all) => all.map((x, j) => (j === i ? next : x)))}
              onRemove={() => void save(drafts.filter((_, j) => j !== i), `Caption ${i + 1} removed.`)}
            />
          ))}
        </ol>
      )}
      <div className="flex flex-wrap items-center gap-2">
        <button type="button" className="rounded-[10px] bg-ink px-4 py-2 font-bold text-paper disabled:opacity-50" disabled={busy} onClick={() => void save(drafts, 'Captions saved.')}>
          Save captions
        </button>
        {drafts.length > 0 && !confirmRemoveAll && (
          <button type="button" className={toolButton} disabled={busy} onClick={() => setConfirmRemoveAll(true)}>
            Remove all captions
          </button>
        )}
        {confirmRemoveAll && (
          <>
            <span className="text-sm">Remove all {drafts.length} captions?</span>
            <button type="button" className="rounded-[10px] bg-error px-3 py-2 text-sm font-bold text-white" disabled={busy} onClick={() => void save([], 'All captions removed.')}>
              Yes, remove all
            </button>
            <button type="button" className={toolButton} onClick={() => setConfirmRemoveAll(false)}>
              Keep them
            </button>
          </>
        )}
      </div>
    </div>
  );
}
