import './zod-without-eval'; // first: before any schema is built
import { useCallback, useEffect, useMemo, useState, useSyncExternalStore } from 'react';
import { QueryClient, QueryClientProvider, useQueryClient } from '@tanstack/react-query';
import Dashboard from '@uppy/react/dashboard';
import '@uppy/core/css/style.min.css';
import '@uppy/dashboard/css/style.min.css';
import './recording-upload/recording-upload.css';
import type { RecordingOutput } from '~/lib/api/recording-schemas';
import { createRecordingUppy, type RecordingUppy } from './recording-upload/recording-uppy';
import { recordingsKey, retryRecording, upsertRecording, useLessonRecordings } from './recording-upload/recordings-api';
import { formatSize, needsPolling } from './recording-upload/recording-labels';
import RecordingStatusList, { type UploadingHere } from './recording-upload/RecordingStatusList';

export interface RecordingUploadProps {
  lessonId: string;
  /** The class's recordings as the page rendered them, newest first. */
  initial: RecordingOutput[];
  /** The server's size limit (MAX_UPLOAD_BYTES), so the browser refuses a file before sending it. */
  maxUploadBytes: number;
}

/**
 * The class page's recording section: pick or drop one video, watch it upload straight to the
 * store (pause, resume, cancel), then follow its processing until members can watch it.
 */
export default function RecordingUpload(props: RecordingUploadProps) {
  const [client] = useState(() => new QueryClient({ defaultOptions: { queries: { refetchOnWindowFocus: true } } }));
  return (
    <QueryClientProvider client={client}>
      <RecordingUploadInner {...props} />
    </QueryClientProvider>
  );
}

/** The recording this window is uploading, read from Uppy's store: percent, bytes and average speed. */
function useUploadingHere(uppy: RecordingUppy): UploadingHere | null {
  const snapshot = useSyncExternalStore(
    useCallback((onChange) => uppy.store.subscribe(onChange), [uppy]),
    () => {
      const file = uppy
        .getFiles()
        // Until the hand-over for processing is done, the recording is still this window's upload.
        .find((f) => f.meta.recordingId && f.progress.uploadStarted && !f.progress.complete);
      if (!file) return '';
      const p = file.progress;
      const phase = file.error ? 'stopped' : p.uploadComplete ? 'handing-over' : file.isPaused ? 'paused' : 'sending';
      return [file.meta.recordingId, p.percentage ?? 0, p.bytesUploaded || 0, p.bytesTotal ?? file.size ?? 0, p.uploadStarted, phase].join('|');
    },
    () => '',
  );
  return useMemo(() => {
    if (!snapshot) return null;
    const [recordingId, percent, uploaded, total, started, phase] = snapshot.split('|');
    // The average speed is measured when the store reports progress; the memo recomputes only then.
    // eslint-disable-next-line react-hooks/purity
    const seconds = (Date.now() - Number(started)) / 1000;
    const bytesPerSecond = seconds > 0.5 && Number(uploaded) > 0 ? Number(uploaded) / seconds : null;
    return {
      recordingId: recordingId!,
      percent: Number(percent),
      bytesUploaded: Number(uploaded),
      bytesTotal: Number(total),
      bytesPerSecond,
      secondsLeft: bytesPerSecond ? (Number(total) - Number(uploaded)) / bytesPerSecond : null,
      phase: phase as UploadingHere['phase'],
    };
  }, [snapshot]);
}

function RecordingUploadInner({ lessonId, initial, maxUploadBytes }: RecordingUploadProps) {
  const queryClient = useQueryClient();
  const [problem, setProblem] = useState<string | null>(null);

  const [uppy] = useState(() =>
    createRecordingUppy({
      lessonId,
      maxUploadBytes,
      onRecording: (rec) =>
        queryClient.setQueryData<RecordingOutput[]>(recordingsKey(lessonId), (list) => upsertRecording(list, rec)),
      onProblem: setProblem,
    }),
  );
  useEffect(() => () => uppy.destroy(), [uppy]);

  const uploadingHere = useUploadingHere(uppy);
  const current = queryClient.getQueryData<RecordingOutput[]>(recordingsKey(lessonId)) ?? initial;
  const poll = needsPolling(current, uploadingHere?.recordingId ?? null);
  const { data: recordings = initial, isRefetchError } = useLessonRecordings(lessonId, initial, poll);

  const onRetry = useCallback(
    async (recordingId: string) => {
      const rec = await retryRecording(recordingId);
      queryClient.setQueryData<RecordingOutput[]>(recordingsKey(lessonId), (list) => upsertRecording(list, rec));
    },
    [queryClient, lessonId],
  );

  const locale = useMemo(
    () => ({
      strings: {
        dropPasteFiles: 'Drop your class recording here or %{browseFiles}',
        browseFiles: 'choose a file',
        dashboardTitle: 'Add a recording',
        uploadXFiles: { 0: 'Upload recording', 1: 'Upload recordings' },
        uploadComplete: 'Uploaded',
        complete: 'Uploaded',
        uploadFailed: 'Upload stopped',
        retry: 'Retry',
        done: 'Add another',
        processingXFiles: { 0: 'Handing over for processing', 1: 'Handing over for processing' },
        xTimeLeft: '%{time} left',
      },
      pluralize: (n: number) => (n === 1 ? 0 : 1),
    }),
    [],
  );

  return (
    <div className="rm-recording-upload flex flex-col gap-5">
      <div className="flex flex-col gap-2">
        <p className="text-ink-soft" id="recording-upload-hint">
          One video file: MP4, MOV, WebM or MKV, up to <span className="tabular">{formatSize(maxUploadBytes)}</span>. It goes
          straight to storage in parts, so a dropped connection picks up where it stopped.
        </p>
        <Dashboard
          uppy={uppy}
          width="100%"
          height={300}
          theme="light"
          // One estimate only: the panel below shows bytes, speed and time left.
          hideProgressDetails
          hidePauseResumeButton={false}
          hideCancelButton={false}
          hideRetryButton={false}
          showRemoveButtonAfterComplete={false}
          proudlyDisplayPoweredByUppy={false}
          // Messages show in the alert below the Dashboard, where they stay until they are dealt with.
          disableInformer
          disableThumbnailGenerator
          doneButtonHandler={() => uppy.clear()}
          locale={locale}
        />
      </div>
      {problem && (
        <p role="alert" className="flex items-start gap-2 rounded-[10px] bg-error/10 p-3 font-semibold text-error" data-upload-problem>
          <svg width="18" height="18" viewBox="0 0 16 16" aria-hidden="true" fill="none" stroke="currentColor" strokeWidth="2" className="mt-0.5 shrink-0">
            <circle cx="8" cy="8" r="6.5" />
            <path d="M8 4.5v4M8 11.2v.3" strokeLinecap="round" />
          </svg>
          <span>{problem}</span>
        </p>
      )}
      <section aria-labelledby="recording-status-title" className="flex flex-col gap-3">
        <h3 id="recording-status-title" className="text-lg">
          Recordings of this class
        </h3>
        {isRefetchError && (
          <p role="status" className="text-sm text-warning">
            We could not refresh this list just now; it tries again by itself.
          </p>
        )}
        <RecordingStatusList recordings={recordings} uploadingHere={uploadingHere} onRetry={onRetry} />
      </section>
    </div>
  );
}
