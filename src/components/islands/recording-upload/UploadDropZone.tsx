import { useCallback, useEffect, useMemo, useState, useSyncExternalStore } from 'react';
import Dashboard from '@uppy/react/dashboard';
import '@uppy/core/css/style.min.css';
import '@uppy/dashboard/css/style.min.css';
import type { RecordingOutput } from '~/lib/api/recording-schemas';
import { createRecordingUppy, type RecordingUppy } from './recording-uppy';
import type { UploadingHere } from './RecordingStatusList';

export interface UploadDropZoneProps {
  lessonId: string;
  maxUploadBytes: number;
  onRecording: (rec: RecordingOutput) => void;
  onProblem: (message: string | null) => void;
  /** The upload this window is sending, for the status list beside it. */
  onUploadingChange: (uploading: UploadingHere | null) => void;
}

const LOCALE = {
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
};

/**
 * The drop zone and the upload itself (Uppy: multipart straight to the store, pause, resume,
 * cancel, and resume after a reload). Loaded on demand by the recording section.
 */
export default function UploadDropZone({ lessonId, maxUploadBytes, onRecording, onProblem, onUploadingChange }: UploadDropZoneProps) {
  const [uppy] = useState(() => createRecordingUppy({ lessonId, maxUploadBytes, onRecording, onProblem }));
  useEffect(() => () => uppy.destroy(), [uppy]);
  const uploadingHere = useUploadingHere(uppy);
  useEffect(() => onUploadingChange(uploadingHere), [uploadingHere, onUploadingChange]);

  return (
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
      locale={LOCALE}
    />
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
