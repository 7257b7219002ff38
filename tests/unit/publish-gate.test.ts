import { describe, expect, it } from 'vitest';
import { gateRefusal, publishGate, type GateInput } from '~/lib/publishing/publish-gate';
import type { Finding } from '~/lib/timing/finding-types';

// Invented findings: only severity matters to the gate.
const finding = (severity: Finding['severity'], code: Finding['code'] = 'overlap'): Finding =>
  ({ severity, code, message: `${severity} ${code}`, atSeconds: 0, segmentIds: [] }) as Finding;

const ready: GateInput = { hasPlan: true, recordingReady: true, findings: [] };

describe('the publish gate', () => {
  it('lets a ready class with a clean check through', () => {
    const gate = publishGate(ready);
    expect(gate.blockers).toEqual([]);
    expect(gateRefusal(gate, ready, false)).toBeNull();
  });

  it.each([
    ['no plan', { ...ready, hasPlan: false }, 'no-plan', ['Add the class plan.']],
    ['recording not ready', { ...ready, recordingReady: false }, 'recording-not-ready', ['Upload the recording and wait until it is ready.']],
    ['recording processing', { ...ready, recordingReady: false, recordingInProgress: true }, 'recording-not-ready', ['Wait for the recording to finish uploading and processing (reload this page to see its progress).']],
    ['two errors', { ...ready, findings: [finding('error'), finding('error'), finding('warning')] }, 'errors', ['Fix the 2 errors the timing check found.']],
    [
      'captions past a shorter recording',
      { ...ready, captionsPastEnd: { count: 2, recordingSeconds: 40.5 } },
      'captions-past-end',
      ['2 captions end after the recording (now 0:40.500 long): in Captions, press “Trim to the recording” or change their times.'],
    ],
  ] as const)('%s: the panel lists what the publish refuses', (_name, input, reason, blockers) => {
    const gate = publishGate(input);
    expect(gate.blockers).toEqual(blockers);
    expect(gateRefusal(gate, input, true)?.reason).toBe(reason);
  });

  it('warnings are not blockers but need an acknowledgement', () => {
    const input = { ...ready, findings: [finding('warning'), finding('info')] };
    const gate = publishGate(input);
    expect(gate.blockers).toEqual([]);
    const refusal = gateRefusal(gate, input, false);
    expect(refusal?.reason).toBe('needs-acknowledgement');
    expect(refusal?.message).toBe('The timing check has 1 warning. Review it and confirm to publish anyway.');
    expect(gateRefusal(gate, input, true)).toBeNull();
  });

  it('the panel blocks exactly when the publish refuses even with warnings acknowledged', () => {
    const inputs: GateInput[] = [];
    for (const hasPlan of [true, false])
      for (const recordingReady of [true, false])
        for (const findings of [[], [finding('warning')], [finding('error')]]) inputs.push({ hasPlan, recordingReady, findings });
    for (const input of inputs) {
      const gate = publishGate(input);
      expect(gate.blockers.length > 0, JSON.stringify(input)).toBe(gateRefusal(gate, input, true) !== null);
    }
  });
});
