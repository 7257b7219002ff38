/**
 * The recording lifecycle table: every event from every position, so a move that is not in the
 * table is refused and one that is leads exactly where the table says.
 */
import { describe, expect, it } from 'vitest';
import {
  canHappen,
  canRetry,
  initialStatus,
  jobForStep,
  LifecycleError,
  nextStatus,
  sameJobContinues,
  TRANSITIONS,
  type RecordingEvent,
  type RecordingStatus,
} from '~/lib/media/recording-lifecycle';

const at = (state: RecordingStatus['state'], step: RecordingStatus['step'] = null, failureKind: RecordingStatus['failureKind'] = null): RecordingStatus => ({
  state,
  step,
  failureKind,
});

/** Every position a stored recording can be in. */
const POSITIONS: [string, RecordingStatus][] = [
  ['uploading/upload', at('uploading', 'upload')],
  ['processing/probe', at('processing', 'probe')],
  ['processing/package', at('processing', 'package')],
  ['processing/upload-outputs', at('processing', 'upload-outputs')],
  ['ready', at('ready')],
  ['failed (refused)', at('failed', null, 'refused')],
  ['failed (interrupted)', at('failed', null, 'interrupted')],
  ['cancelled', at('cancelled')],
];

/** The expected table, written out by hand: [event, allowed from, resulting status]. */
const EXPECTED: [RecordingEvent, string[], RecordingStatus][] = [
  ['upload-finished', ['uploading/upload'], at('processing', 'probe')],
  ['upload-refused', ['uploading/upload'], at('failed', null, 'refused')],
  ['upload-cancelled', ['uploading/upload'], at('cancelled')],
  ['upload-abandoned', ['uploading/upload'], at('failed', null, 'refused')],
  ['probed', ['processing/probe'], at('processing', 'package')],
  ['packaged', ['processing/package'], at('processing', 'upload-outputs')],
  ['outputs-stored', ['processing/upload-outputs'], at('ready')],
  ['refused', ['processing/probe', 'processing/package'], at('failed', null, 'refused')],
  ['interrupted', ['processing/probe', 'processing/package', 'processing/upload-outputs'], at('failed', null, 'interrupted')],
  // Retry only where it can help: never after a refusal of the file.
  ['retried', ['failed (interrupted)'], at('processing', 'probe')],
];

describe('recording lifecycle table', () => {
  it('lists every event once', () => {
    expect(Object.keys(TRANSITIONS).sort()).toEqual(EXPECTED.map(([e]) => e).sort());
  });

  describe.each(EXPECTED)('%s', (event, allowed, to) => {
    it.each(POSITIONS)('from %s', (name, from) => {
      if (allowed.includes(name)) {
        expect(canHappen(event, from)).toBe(true);
        expect(nextStatus(from, event)).toEqual(to);
      } else {
        expect(canHappen(event, from)).toBe(false);
        expect(() => nextStatus(from, event)).toThrow(LifecycleError);
      }
    });
  });

  it('starts an upload in the browser and a demo file at its probe', () => {
    expect(initialStatus('upload')).toEqual(at('uploading', 'upload'));
    expect(initialStatus('demo')).toEqual(at('processing', 'probe'));
  });

  it.each([
    [at('failed', null, 'interrupted'), true],
    [at('failed', null, 'refused'), false],
    [at('cancelled'), false],
    [at('ready'), false],
    [at('processing', 'package'), false],
  ])('offers Retry for %o: %s', (status, expected) => {
    expect(canRetry(status)).toBe(expected);
  });

  it.each([
    ['upload', null],
    ['probe', 'recording.probe'],
    ['package', 'recording.package'],
    ['upload-outputs', 'recording.package'],
  ] as const)('resumes the %s step with %s', (step, job) => {
    expect(jobForStep(step)).toBe(job);
  });

  it.each([
    // Packaging goes on to upload its outputs in the same job: its heartbeat continues.
    [at('processing', 'package'), at('processing', 'upload-outputs'), true],
    // Probing hands over to a packaging job that waits in the queue.
    [at('processing', 'probe'), at('processing', 'package'), false],
    [at('uploading', 'upload'), at('processing', 'probe'), false],
    [at('processing', 'upload-outputs'), at('ready'), false],
  ])('%o -> %o keeps the same job: %s', (from, to, expected) => {
    expect(sameJobContinues(from, to)).toBe(expected);
  });
});
