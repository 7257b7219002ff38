import './zod-without-eval'; // first: before any schema is built
import { lazy, Suspense, useCallback, useState, useSyncExternalStore } from 'react';
import { QueryClient, QueryClientProvider, useQueryClient } from '@tanstack/react-query';
import './recording-upload/recording-upload.css';
import type { RecordingOutput } from '~/lib/api/recording-schemas';
import { recordingsKey, retryRecording, upsertRecording, useLessonRecordings } from './recording-upload/recordings-api';
import { formatSize, needsPolling } from './recording-upload/recording-labels';
import RecordingStatusList, { type UploadingHere } from './recording-upload/RecordingStatusList';

// The uploader (Uppy and its dashboard: about a third of the staff page's script) loads only when
// the page needs it: the class has no usable recording yet, an upload from earlier waits to be
// resumed, or the coach asks to upload another. Editing the marks of a ready class never loads it.
const UploadDropZone = lazy(() => import('./recording-upload/UploadDropZone'));

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

function RecordingUploadInner({ lessonId, initial, maxUploadBytes }: RecordingUploadProps) {
  const queryClient = useQueryClient();
  const [problem, setProblem] = useState<string | null>(null);

  const [uploadingHere, setUploadingHere] = useState<UploadingHere | null>(null);
  const onRecording = useCallback(
    (rec: RecordingOutput) => queryClient.setQueryData<RecordingOutput[]>(recordingsKey(lessonId), (list) => upsertRecording(list, rec)),
    [queryClient, lessonId],
  );
  const current = queryClient.getQueryData<RecordingOutput[]>(recordingsKey(lessonId)) ?? initial;
  const poll = needsPolling(current, uploadingHere?.recordingId ?? null);
  const { data: recordings = initial, isRefetchError } = useLessonRecordings(lessonId, initial, poll);
  // Once shown, the uploader stays: it holds the upload in progress.
  const [showUploader, setShowUploader] = useState(false);
  const needsUploader = !recordings.some((r) => r.state === 'ready' || r.state === 'processing' || r.state === 'uploading');
  // The server cannot see this browser's saved upload: false there, read in the browser.
  const savedUpload = useSyncExternalStore(noChanges, () => hasSavedUpload(lessonId), () => false);
  const inBrowser = useSyncExternalStore(noChanges, () => true, () => false);
  if (!showUploader && (needsUploader || savedUpload)) setShowUploader(true);

  const onRetry = useCallback(
    async (recordingId: string) => {
      const rec = await retryRecording(recordingId);
      queryClient.setQueryData<RecordingOutput[]>(recordingsKey(lessonId), (list) => upsertRecording(list, rec));
    },
    [queryClient, lessonId],
  );

  return (
    <div className="rm-recording-upload flex flex-col gap-5">
      <div className="flex flex-col gap-2">
        <p className="text-ink-soft" id="recording-upload-hint">
          One video file: MP4, MOV, WebM or MKV, up to <span className="tabular">{formatSize(maxUploadBytes)}</span>. It goes
          straight to storage in parts, so a dropped connection picks up where it stopped.
        </p>
        {showUploader ? (
          // Rendered in the browser only: a suspended component in server rendering would make React
          // stream inline scripts, which the Content-Security-Policy (hashed scripts only) refuses.
          inBrowser ? (
            <Suspense fallback={uploaderLoading}>
              <UploadDropZone lessonId={lessonId} maxUploadBytes={maxUploadBytes} onRecording={onRecording} onProblem={setProblem} onUploadingChange={setUploadingHere} />
            </Suspense>
          ) : (
            uploaderLoading
          )
        ) : (
          <button type="button" className="self-start rounded-[10px] border border-ink px-3 py-1 font-semibold" onClick={() => setShowUploader(true)}>
            Upload another recording
          </button>
        )}
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

const noChanges = () => () => {};

const uploaderLoading = (
  <p className="text-ink-soft" role="status">
    Getting the uploader ready…
  </p>
);

/** Whether this browser keeps an unfinished upload of this class (Uppy's saved state) to resume. */
function hasSavedUpload(lessonId: string): boolean {
  try {
    return typeof localStorage !== 'undefined' && localStorage.getItem(`uppyState:recording-${lessonId}`) !== null;
  } catch {
    return false; // storage blocked: nothing to resume
  }
}
