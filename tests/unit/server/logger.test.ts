import { describe, expect, it } from 'vitest';
import { captureLogLines, loggableUrl, logger } from '../../../server/lib/logger.ts';

const TOKEN = 'A1b2C3d4E5f6G7h8I9j0K1l2M3n4O5p6Q7r8S9t0_-x';

describe('loggableUrl', () => {
  it.each([
    [`/api/invitations/inv_${TOKEN}`, '/api/invitations/inv_[Redacted]'],
    [`/api/invitations/inv_${TOKEN}/accept`, '/api/invitations/inv_[Redacted]/accept'],
    [`/api/auth/password-reset/rst_${TOKEN}?x=1`, '/api/auth/password-reset/rst_[Redacted]?x=1'],
    [`/sign-up/confirm/sgn_${TOKEN}`, '/sign-up/confirm/sgn_[Redacted]'],
    ['/api/runs/7d4c2f9e-1f0a-4c7e-9a51-0d3b6f2e8a11', '/api/runs/7d4c2f9e-1f0a-4c7e-9a51-0d3b6f2e8a11'],
    ['/api/plans?from=2026-01-01', '/api/plans?from=2026-01-01'],
    ['', ''],
  ])('%s → %s', (url, expected) => {
    expect(loggableUrl(url)).toBe(expected);
  });
});

describe('captureLogLines', () => {
  it('hands every line to the reader until it is detached, then restores the level', () => {
    const levelBefore = logger.level;
    const lines: string[] = [];
    const detach = captureLogLines((line) => lines.push(line), 'info');
    logger.debug('below the level');
    logger.info({ run: 1 }, 'read by the test');
    detach();
    logger.info('after detaching');
    expect(lines).toHaveLength(1);
    expect(JSON.parse(lines[0]!)).toMatchObject({ level: 30, run: 1, msg: 'read by the test' });
    expect(logger.level).toBe(levelBefore);
  });
});
