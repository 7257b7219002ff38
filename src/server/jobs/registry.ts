import { JOB_NAMES, type JobName } from '../queue';
import type { JobHandler } from './job-context';
import { chapterThumbnails } from './chapter-thumbnails';
import { coverFrame } from './cover-frame';
import { cleanupUploads } from './cleanup-uploads';
import { publishDue } from './publish-due';
import { packageRecording } from './package-recording';
import { probeRecording } from './probe-recording';
import { recordingStep } from './recording-step';
import { analyzeAudioEvents } from './analyze-audio-events';
import { mailClassPublished } from './mail-class-published';
import { mailTrialReminders } from './mail-trial-reminders';
import { mailReviewRequested, mailReviewSentBack } from './mail-review';
import { mailPasswordReset, mailSignUpAttempt, mailVerifyEmail } from './mail-account';

/** One handler per job name. */
export const JOB_HANDLERS: { [N in JobName]: JobHandler<N> } = {
  'recording.probe': recordingStep('recording.probe', probeRecording),
  'recording.package': recordingStep('recording.package', packageRecording),
  'recording.audio-events': analyzeAudioEvents,
  'uploads.cleanup': cleanupUploads,
  'lessons.publish-due': publishDue,
  'version.thumbnails': chapterThumbnails,
  'cover.frame': coverFrame,
  'mail.class-published': mailClassPublished,
  'mail.trial-reminders': mailTrialReminders,
  'mail.verify-email': mailVerifyEmail,
  'mail.sign-up-attempt': mailSignUpAttempt,
  'mail.password-reset': mailPasswordReset,
  'mail.review-requested': mailReviewRequested,
  'mail.review-sent-back': mailReviewSentBack,
};

/** Refuses to start when a queue has no handler or a handler no queue (checked at worker start). */
export function assertRegistryComplete(): void {
  const handled = Object.keys(JOB_HANDLERS).sort();
  const named = [...JOB_NAMES].sort();
  if (handled.join() !== named.join()) {
    throw new Error(`job registry mismatch: queues ${named.join(', ')} vs handlers ${handled.join(', ')}`);
  }
}
