import Uppy, { RestrictionError, type UppyFile } from '@uppy/core';
import GoldenRetriever from '@uppy/golden-retriever';
import AwsS3, { type AwsBody } from '@uppy/aws-s3';
import { ACCEPTED_EXTENSIONS, ACCEPTED_TYPES, fileExtension, type RecordingOutput } from '~/lib/api/recording-schemas';
import {
  ApiError,
  announcementFor,
  announceRecording,
  cancelRecording,
  checkAnnouncement,
  completeRecording,
  signRecordingRequest,
} from './recordings-api';
import { formatSize } from './recording-labels';

/** What the widget keeps on each Uppy file: the recording the server created for it. */
export type RecordingMeta = { recordingId?: string };
export type RecordingUppy = Uppy<RecordingMeta, AwsBody>;
type RecordingFile = UppyFile<RecordingMeta, AwsBody>;

export interface RecordingUppyOptions {
  lessonId: string;
  maxUploadBytes: number;
  /** A recording the server answered (created, or handed over for processing). */
  onRecording: (rec: RecordingOutput) => void;
  /** A message for the coach that should stay on screen (the Dashboard's own notes fade). */
  onProblem: (message: string | null) => void;
}

/** Automatic retries after a dropped connection; each resumes from the parts the store lists. */
const AUTO_RETRY_DELAYS_MS = [2_000, 5_000, 15_000, 30_000];

const CONNECTION_DROPPED =
  'The connection dropped. The upload carries on from the last finished part as soon as it is back; keep this page open.';

/**
 * Browsers report MKV as '' and some report M4V as 'video/x-m4v'. The server takes an accepted
 * extension with an unknown type as application/octet-stream, so announce it that way and send
 * the same type to the store (the create request is signed with the announced type).
 */
export function announcedType(name: string, type: string | undefined): string {
  const t = type ?? '';
  if (ACCEPTED_TYPES.includes(t)) return t;
  return (ACCEPTED_EXTENSIONS as readonly string[]).includes(fileExtension(name)) ? 'application/octet-stream' : t;
}

const messageOf = (err: unknown) =>
  err instanceof Error ? err.message : 'Something went wrong on our side. Please try again.';

/**
 * Builds the Uppy instance of the class page: one video file, announced to our API before it
 * uploads, sent straight to the object store as an S3 multipart upload whose every request our
 * API presigns, and handed over for processing when the store has it all.
 */
export function createRecordingUppy({ lessonId, maxUploadBytes, onRecording, onProblem }: RecordingUppyOptions): RecordingUppy {
  const uppy: RecordingUppy = new Uppy<RecordingMeta, AwsBody>({
    id: `recording-${lessonId}`,
    autoProceed: false,
    allowMultipleUploadBatches: true,
    infoTimeout: 8_000,
    restrictions: {
      maxNumberOfFiles: 1,
      maxFileSize: maxUploadBytes,
      allowedFileTypes: ACCEPTED_EXTENSIONS.map((e) => `.${e}`),
    },
    // The server's own schema decides first, so the browser says exactly what the API would.
    onBeforeFileAdded: (file) => {
      const type = announcedType(file.name ?? '', file.type);
      const problem = checkAnnouncement(announcementFor({ ...file, type }), maxUploadBytes, formatSize);
      if (problem) throw new RestrictionError<RecordingMeta, AwsBody>(problem, { file, isUserFacing: true });
      onProblem(null);
      return type === file.type ? file : { ...file, type };
    },
    locale: {
      strings: {
        youCanOnlyUploadX: { 0: 'Add one recording at a time.', 1: 'Add one recording at a time.' },
        noMoreFilesAllowed: 'Add one recording at a time. Remove this one to choose another.',
        youCanOnlyUploadFileTypes: 'Roundmark takes video files in MP4, MOV, WebM or MKV.',
        exceedsSize: '%{file} is larger than %{size}, the largest recording Roundmark takes.',
        failedToUpload: '%{file} did not upload.',
        noInternetConnection: 'You are offline. The upload carries on when the connection is back.',
        connectedToInternet: 'Back online.',
      },
      pluralize: (n: number) => (n === 1 ? 0 : 1),
    },
  });

  // Keys the store uses for each recording (the server picks them): request key -> recording id.
  // Kept here too because a cancel signs its abort after Uppy dropped the file.
  const recordingByKey = new Map<string, string>();
  const recordingForKey = (key: string): string | undefined =>
    recordingByKey.get(key) ?? uppy.getFiles().find((f) => (f as RecordingFile & { s3Multipart?: { key: string } }).s3Multipart?.key === key)?.meta.recordingId;

  uppy.use(AwsS3<RecordingMeta, AwsBody>, {
    // Always multipart, even for small files: size limits, resume and abort then work the same way.
    shouldUseMultipart: () => true,
    // Uppy 6 counts files here; the parts of one file go one after another.
    limit: 4,
    allowedMetaFields: [],
    // The proposed key only tells our signer which recording this is; the server answers the real key.
    generateObjectKey: (file) => file.meta.recordingId ?? file.id,
    signRequest: async (req) => {
      const recordingId = recordingForKey(req.key);
      if (!recordingId) throw new Error('This upload lost track of its recording. Remove the file and add it again.');
      const signed = await signRecordingRequest(recordingId, {
        method: req.method,
        key: req.key,
        ...('uploadId' in req ? { uploadId: req.uploadId } : {}),
        ...('partNumber' in req ? { partNumber: req.partNumber } : {}),
        ...('contentType' in req && req.contentType ? { contentType: req.contentType } : {}),
      });
      recordingByKey.set(signed.key, recordingId);
      return signed;
    },
  });

  // Keeps the file's state (its recording id and multipart upload id) across a page reload or a
  // closed tab, so the upload resumes from the parts the store already has. Large files come back
  // as placeholders the coach re-selects; small ones are kept whole in IndexedDB.
  // Only in the browser: during server rendering there is no IndexedDB, and its restore would log
  // "indexedDB.open is not a function" on every render of the class page.
  if (typeof indexedDB !== 'undefined' && typeof window !== 'undefined') {
    uppy.use(GoldenRetriever<RecordingMeta, AwsBody>, { serviceWorker: false, expires: 24 * 60 * 60 * 1000 });
  }

  // Before the bytes go: announce the file, so the server checks it and fixes where it goes.
  // On a retry the file already has its recording, and the upload resumes instead.
  uppy.addPreProcessor(async (fileIDs) => {
    for (const id of fileIDs) {
      const file = uppy.getFile(id);
      if (!file || file.meta.recordingId) continue;
      uppy.emit('preprocess-progress', file, { mode: 'indeterminate', message: 'Getting ready…' });
      try {
        const rec = await announceRecording(lessonId, announcementFor(file));
        recordingByKey.set(rec.id, rec.id);
        uppy.setFileMeta(id, { recordingId: rec.id });
        onRecording(rec);
      } catch (err) {
        onProblem(messageOf(err));
        // Marks only this file failed; the uploader skips it and the Dashboard offers Retry.
        uppy.emit('upload-error', file, err instanceof Error ? err : new Error(messageOf(err)));
      } finally {
        uppy.emit('preprocess-complete', uppy.getFile(id) ?? file);
      }
    }
  });

  // After the store has every part: hand the recording over for processing.
  uppy.addPostProcessor(async (fileIDs) => {
    for (const id of fileIDs) {
      const file = uppy.getFile(id);
      const recordingId = file?.meta.recordingId;
      if (!file || !recordingId || file.error || !file.progress.uploadComplete) continue;
      uppy.emit('postprocess-progress', file, { mode: 'indeterminate', message: 'Handing over for processing…' });
      try {
        onRecording(await withRetries(() => completeRecording(recordingId)));
        onProblem(null);
      } catch (err) {
        onProblem(`The file is uploaded, but we could not start processing it: ${messageOf(err)}`);
      } finally {
        uppy.emit('postprocess-complete', uppy.getFile(id) ?? file);
      }
    }
  });

  // A request that fails on a dropped connection fails the upload; retry with a growing pause. The
  // retry lists the parts the store already has (a signed GET) and sends only the rest.
  const attempts = new Map<string, number>();
  uppy.on('upload-error', (file, err) => {
    if (!file) return;
    const recoverable = !(err instanceof ApiError) || err.status === 0 || err.status >= 500;
    const n = attempts.get(file.id) ?? 0;
    if (!recoverable || n >= AUTO_RETRY_DELAYS_MS.length) {
      onProblem(
        err instanceof ApiError
          ? err.message
          : `${file.name ?? 'The file'} stopped uploading (${messageOf(err)}). Press Retry to carry on from where it stopped.`,
      );
      return;
    }
    onProblem(CONNECTION_DROPPED);
    attempts.set(file.id, n + 1);
    setTimeout(() => {
      const current = uppy.getFile(file.id);
      if (current?.error && navigator.onLine !== false) void uppy.retryUpload(file.id).catch(() => {});
    }, AUTO_RETRY_DELAYS_MS[n]);
  });

  // A request the uploader starts while the browser says it is offline does not fail: it waits,
  // silently, for the `online` event (so a part that finishes just after the drop left the coach
  // with no word). So when the browser goes offline, hold the upload ourselves with the uploader's
  // own pause (it aborts the part in flight and keeps the multipart upload) and say so; when it is
  // back, start it again, which lists the parts the store has and sends only the rest. Uppy's pause
  // state is left alone: the coach did not pause, and a coach's pause stays theirs.
  const sendingFiles = () =>
    uppy.getFiles().filter((f) => f.progress.uploadStarted && !f.progress.uploadComplete && !f.isPaused && !f.error);
  uppy.on('is-offline', () => {
    const held = sendingFiles();
    for (const f of held) uppy.emit('upload-pause', f, true);
    if (held.length > 0) onProblem(CONNECTION_DROPPED);
  });
  uppy.on('back-online', () => {
    for (const f of sendingFiles()) uppy.emit('upload-pause', f, false);
    if (uppy.getFiles().some((f) => f.error)) void uppy.retryAll().catch(() => {});
  });
  // A resume pressed while offline waits for the connection in the same way.
  const noteIfOffline = () => {
    if (navigator.onLine === false) onProblem(CONNECTION_DROPPED);
  };
  uppy.on('resume-all', noteIfOffline);
  uppy.on('upload-pause', (_file, isPaused) => {
    if (!isPaused) noteIfOffline();
  });
  uppy.on('upload-success', (file) => {
    if (file) attempts.delete(file.id);
    onProblem(null);
  });
  uppy.on('restriction-failed', (_file, err) => onProblem(err.message));
  uppy.on('file-removed', (file) => {
    onProblem(null);
    // A file removed before it finished was cancelled: the server marks it at once.
    const recordingId = file.meta.recordingId;
    if (recordingId && !file.progress.uploadComplete) void cancelRecording(recordingId).then(onRecording, () => {});
  });

  return uppy;
}

/** Runs a request up to three times when the network or our server hiccups (not on a 4xx answer). */
async function withRetries<T>(fn: () => Promise<T>): Promise<T> {
  for (let attempt = 0; ; attempt++) {
    try {
      return await fn();
    } catch (err) {
      const transient = err instanceof ApiError && (err.status === 0 || err.status >= 500);
      if (!transient || attempt >= 2) throw err;
      await new Promise((r) => setTimeout(r, 1_000 * 2 ** attempt));
    }
  }
}
