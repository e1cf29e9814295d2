import type { Role } from '../users/schemas.ts';

/**
 * What a role may do, in one table. Routes name a permission; the server's `authorize` asks here.
 * Reading another person's data is decided by `canReadRunnerData`, which also needs squad membership.
 */
export const PERMISSIONS = {
  /** Any signed-in user: own runs, plans, profile, tokens. */
  'own-data': ['runner', 'coach', 'admin'],
  /** Create squads, invite runners, write plans for squad runners. */
  'squads:manage': ['coach'],
  /** List users, change roles, see service health. */
  'users:manage': ['admin'],
} as const satisfies Record<string, readonly Role[]>;

export type Permission = keyof typeof PERMISSIONS;

export function hasPermission(role: Role, permission: Permission): boolean {
  return (PERMISSIONS[permission] as readonly Role[]).includes(role);
}

export interface Actor {
  id: string;
  role: Role;
}

/**
 * May `actor` read the runs, plans and weeks of the runner `ownerId`?
 * Yes for the runner, an admin, and a coach of a squad the runner currently belongs to.
 * `coachIdsOfOwner` are the ids of the coaches of the owner's current squads.
 */
export function canReadRunnerData(actor: Actor, ownerId: string, coachIdsOfOwner: readonly string[]): boolean {
  if (actor.id === ownerId || actor.role === 'admin') return true;
  return actor.role === 'coach' && coachIdsOfOwner.includes(actor.id);
}

/** Roles the navigation shows each section to (client) — the same table the server enforces. */
export function visibleSections(role: Role): Array<'log' | 'plan' | 'week' | 'squad' | 'tools' | 'admin'> {
  const sections: Array<'log' | 'plan' | 'week' | 'squad' | 'tools' | 'admin'> = ['log', 'plan', 'week'];
  if (hasPermission(role, 'squads:manage')) sections.push('squad');
  sections.push('tools');
  if (hasPermission(role, 'users:manage')) sections.push('admin');
  return sections;
}
