import { describe, expect, it } from 'vitest';
import { ACTIONS, can, type Action } from '~/lib/policy';
import { roles, type Role } from '~/lib/api/auth-schemas';

// The expected answer for every role and action, written out by hand from the product brief
// (/work/shared/design.md "Who uses it"): owners do everything staff do plus pricing, invites
// and scheduling; coaches publish; editors prepare but never publish, price or invite; members
// only manage their own membership. O = owner, C = coach, E = editor, M = member.
const expected: Record<Action, string> = {
  'studio.view': 'OCE',
  'class.view': 'OCE',
  'class.create': 'OCE',
  'class.edit': 'OCE',
  'class.delete': 'OC',
  'class.check': 'OCE',
  'class.publish': 'OC',
  'class.request-review': 'OCE',
  'class.send-back': 'OC',
  'class.schedule': 'O',
  'class.unpublish': 'OC',
  'class.archive': 'OC',
  'class.insights': 'OC',
  'recording.upload': 'OCE',
  'exercise.edit': 'OCE',
  'team.manage': 'O',
  'studio.settings': 'O',
  'billing.manage': 'O',
  'members.view': 'O',
  'mail.preview': 'O',
  'membership.manage': 'M',
};
const letter: Record<Role, string> = { owner: 'O', coach: 'C', editor: 'E', member: 'M' };

describe('the policy table', () => {
  it('has an expectation for every action it defines, and no others', () => {
    expect([...ACTIONS].sort()).toEqual(Object.keys(expected).sort());
  });

  const cases = ACTIONS.flatMap((action) => roles.map((role) => [action, role, expected[action].includes(letter[role])] as const));
  it.each(cases)('%s as %s: %s', (action, role, allowed) => {
    expect(can({ roles: [role] }, action)).toBe(allowed);
  });

  it.each(ACTIONS)('%s: refused to nobody-in-particular (no studio, no roles)', (action) => {
    expect(can(null, action)).toBe(false);
    expect(can({ roles: [] }, action)).toBe(false);
  });

  it('a person holding two roles may do what either allows', () => {
    expect(can({ roles: ['editor', 'member'] }, 'class.edit')).toBe(true);
    expect(can({ roles: ['editor', 'member'] }, 'membership.manage')).toBe(true);
    expect(can({ roles: ['editor', 'member'] }, 'class.publish')).toBe(false);
  });
});
