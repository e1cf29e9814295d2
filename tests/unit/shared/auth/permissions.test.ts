import { describe, expect, it } from 'vitest';
import { canReadRunnerData, hasPermission, visibleSections } from '../../../../shared/auth/permissions.ts';

describe('hasPermission', () => {
  it.each([
    ['runner', 'own-data', true],
    ['runner', 'squads:manage', false],
    ['runner', 'users:manage', false],
    ['coach', 'squads:manage', true],
    ['coach', 'users:manage', false],
    ['admin', 'users:manage', true],
    ['admin', 'squads:manage', false],
  ] as const)('%s → %s is %s', (role, permission, expected) => {
    expect(hasPermission(role, permission)).toBe(expected);
  });
});

describe('canReadRunnerData', () => {
  const owner = 'runner-1';
  it.each([
    ['the runner themself', { id: owner, role: 'runner' }, [], true],
    ['another runner', { id: 'runner-2', role: 'runner' }, [], false],
    ['their coach', { id: 'coach-1', role: 'coach' }, ['coach-1'], true],
    ['a coach of another squad', { id: 'coach-2', role: 'coach' }, ['coach-1'], false],
    ['a runner listed as coach id but without the coach role', { id: 'coach-1', role: 'runner' }, ['coach-1'], false],
    ['an admin', { id: 'admin-1', role: 'admin' }, [], true],
  ] as const)('%s → %s', (_label, actor, coaches, expected) => {
    expect(canReadRunnerData(actor, owner, coaches)).toBe(expected);
  });
});

describe('visibleSections', () => {
  it.each([
    ['runner', ['log', 'plan', 'week', 'tools']],
    ['coach', ['log', 'plan', 'week', 'squad', 'tools']],
    ['admin', ['log', 'plan', 'week', 'tools', 'admin']],
  ] as const)('%s sees %j', (role, sections) => {
    expect(visibleSections(role)).toEqual(sections);
  });
});
