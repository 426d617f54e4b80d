import { describe, expect, it } from 'vitest';
import { CallMessage, CancelMessage, PickPurpose } from '../../../electron/ipc-contract';

// The desktop shell's IPC contract: every message from the renderer is checked before the
// main process acts on it (Electron's security checklist: validate the sender and the
// arguments of every IPC message). Malformed messages are refused with a reason.
describe('IPC messages from the renderer', () => {
  it('accepts a well-formed call', () => {
    const r = CallMessage.safeParse({ name: 'specimens.list', input: { catalogue: 'a.sqlite' }, callId: 'c12' });
    expect(r.success).toBe(true);
  });

  it('refuses names that are not request names, odd call ids and extra fields, saying which', () => {
    const cases: Array<[unknown, string]> = [
      [{ name: '../../etc', input: {}, callId: 'c1' }, 'name'],
      [{ name: 'Specimens.list', input: {}, callId: 'c1' }, 'name'],
      [{ name: 'x'.repeat(200), input: {}, callId: 'c1' }, 'name'],
      [{ name: 'specimens.list', input: {}, callId: 'x1' }, 'callId'],
      [{ name: 'specimens.list', input: {}, callId: 'c1', eval: 'alert(1)' }, ''],
      ['specimens.list', ''],
      [null, ''],
    ];
    for (const [message, field] of cases) {
      const r = CallMessage.safeParse(message);
      expect(r.success, JSON.stringify(message)).toBe(false);
      if (!r.success && field) expect(r.error.issues.map((i) => i.path.join('.'))).toContain(field);
    }
  });

  it('checks cancel ids and file-dialog purposes', () => {
    expect(CancelMessage.safeParse('c3').success).toBe(true);
    expect(CancelMessage.safeParse({}).success).toBe(false);
    expect(PickPurpose.safeParse('open-catalogue').success).toBe(true);
    expect(PickPurpose.safeParse('read-any-file').success).toBe(false);
  });
});
