import type { Finding } from '../timing/finding-types';
import { formatPreciseTime } from '../time/format-time';

/**
 * The publish rule, once: the panel lists what it says, and the publish itself refuses with the
 * same words. Errors block; warnings need an acknowledgement; a plan and a ready recording are
 * required. Pure, so both sides cannot disagree.
 */
export interface GateInput {
  hasPlan: boolean;
  recordingReady: boolean;
  /** A recording is uploading or processing right now (so "upload one" would be the wrong advice). */
  recordingInProgress?: boolean;
  /** The timing check's findings; empty when there is no plan to check against. */
  findings: readonly Finding[];
  /**
   * Draft captions that end after the current recording (a newer, shorter recording replaced the
   * one they were timed against): members would read them after the video ends, so they block.
   */
  captionsPastEnd?: { count: number; recordingSeconds: number };
}

export interface PublishGate {
  /** What must change before anyone can publish, in the words the panel shows. */
  blockers: string[];
  errors: Finding[];
  warnings: Finding[];
}

const plural = (n: number, one: string, many: string) => (n === 1 ? one : many);

export function publishGate(input: GateInput): PublishGate {
  const errors = input.findings.filter((f) => f.severity === 'error');
  const warnings = input.findings.filter((f) => f.severity === 'warning');
  const blockers = [
    ...(input.hasPlan ? [] : ['Add the class plan.']),
    ...(input.recordingReady
      ? []
      : input.recordingInProgress
        ? ['Wait for the recording to finish uploading and processing (reload this page to see its progress).']
        : ['Upload the recording and wait until it is ready.']),
    ...(errors.length ? [`Fix the ${errors.length} error${plural(errors.length, '', 's')} the timing check found.`] : []),
    ...(input.captionsPastEnd?.count ? [captionsPastEndMessage(input.captionsPastEnd)] : []),
  ];
  return { blockers, errors, warnings };
}

function captionsPastEndMessage({ count, recordingSeconds }: { count: number; recordingSeconds: number }): string {
  return `${count} caption${plural(count, ' ends', 's end')} after the recording (now ${formatPreciseTime(recordingSeconds)} long): in Captions, press “Trim to the recording” or change ${plural(count, 'its', 'their')} times.`;
}

/** Why a publish is refused right now, or null when it may go ahead. */
export type GateRefusal =
  | { reason: 'no-plan'; message: string }
  | { reason: 'recording-not-ready'; message: string }
  | { reason: 'errors'; message: string; findings: Finding[] }
  | { reason: 'captions-past-end'; message: string }
  | { reason: 'needs-acknowledgement'; message: string; findings: Finding[] };

export function gateRefusal(gate: PublishGate, input: GateInput, acknowledgeWarnings: boolean): GateRefusal | null {
  if (!input.hasPlan) return { reason: 'no-plan', message: 'This class has no plan yet. Add its plan, mark the recording, then publish.' };
  if (!input.recordingReady) return { reason: 'recording-not-ready', message: 'The recording is not ready yet. Publish once it has finished processing.' };
  const e = gate.errors.length;
  if (e) {
    return {
      reason: 'errors',
      message: `The timing check found ${e} error${plural(e, '', 's')}. Fix ${plural(e, 'it', 'them')} in the timeline, then publish.`,
      findings: gate.errors,
    };
  }
  if (input.captionsPastEnd?.count) return { reason: 'captions-past-end', message: `Not published: ${captionsPastEndMessage(input.captionsPastEnd)}` };
  const w = gate.warnings.length;
  if (w && !acknowledgeWarnings) {
    return {
      reason: 'needs-acknowledgement',
      message: `The timing check has ${w} warning${plural(w, '', 's')}. Review ${plural(w, 'it', 'them')} and confirm to publish anyway.`,
      findings: gate.warnings,
    };
  }
  return null;
}
