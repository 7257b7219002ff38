import type { Role } from './api/auth-schemas';

/**
 * Who may do what in a studio: the one table every permission check reads. Use cases assert it
 * (src/server/use-cases/actor.ts); pages read it only to show or hide controls. Pure, so the
 * table is tested directly for every role and action.
 */
export interface Actor {
  userId: string;
  studioId: string;
  roles: readonly Role[];
}

/** People who prepare classes. */
export const STAFF = ['owner', 'coach', 'editor'] as const satisfies readonly Role[];
/** People who publish, and so decide what members see. */
export const PUBLISHERS = ['owner', 'coach'] as const satisfies readonly Role[];
const OWNER = ['owner'] as const satisfies readonly Role[];
const MEMBER = ['member'] as const satisfies readonly Role[];

interface Rule {
  roles: readonly Role[];
  /** What a refused person is told. */
  refusal: string;
}

const staffOnly = 'Your role in this studio does not allow this.';

export const POLICY = {
  'studio.view': { roles: STAFF, refusal: staffOnly },
  'class.view': { roles: STAFF, refusal: staffOnly },
  'class.create': { roles: STAFF, refusal: staffOnly },
  'class.edit': { roles: STAFF, refusal: staffOnly },
  'class.delete': { roles: PUBLISHERS, refusal: 'Only coaches and the studio owner can delete a class.' },
  'class.check': { roles: STAFF, refusal: staffOnly },
  'class.publish': { roles: PUBLISHERS, refusal: 'Only coaches and the studio owner can publish. Let them know the class is ready.' },
  'class.request-review': { roles: STAFF, refusal: staffOnly },
  'class.send-back': { roles: PUBLISHERS, refusal: 'Only coaches and the studio owner review classes and send them back.' },
  'class.schedule': { roles: OWNER, refusal: 'Only the studio owner can schedule a publish.' },
  'class.unpublish': { roles: PUBLISHERS, refusal: 'Only coaches and the studio owner can take a class out of the library.' },
  'class.archive': { roles: PUBLISHERS, refusal: 'Only coaches and the studio owner can archive a class.' },
  'class.insights': { roles: PUBLISHERS, refusal: 'Only coaches and the studio owner see a class’s insights.' },
  'recording.upload': { roles: STAFF, refusal: staffOnly },
  'exercise.edit': { roles: STAFF, refusal: staffOnly },
  'team.manage': { roles: OWNER, refusal: 'Only the studio owner can invite and manage the team.' },
  'studio.settings': { roles: OWNER, refusal: 'Only the studio owner changes the studio’s settings.' },
  'billing.manage': { roles: OWNER, refusal: 'Only the studio owner can change prices and promo codes.' },
  'members.view': { roles: OWNER, refusal: 'Only the studio owner sees the members and their memberships.' },
  'mail.preview': { roles: OWNER, refusal: 'Only the studio owner sees the e-mail the studio sends.' },
  'membership.manage': { roles: MEMBER, refusal: 'Staff accounts watch every class already; memberships are for members.' },
} as const satisfies Record<string, Rule>;

export type Action = keyof typeof POLICY;
export const ACTIONS = Object.keys(POLICY) as Action[];

/** Whether the actor holds a role the action allows. */
export function can(actor: Pick<Actor, 'roles'> | null | undefined, action: Action): boolean {
  const allowed: readonly Role[] = POLICY[action].roles;
  return !!actor && actor.roles.some((r) => allowed.includes(r));
}

/** What to tell someone the table refuses. */
export const refusalFor = (action: Action): string => POLICY[action].refusal;
