import { planChangeNotice, PLAN_NOTICE_QUIET_MINUTES } from '../../../shared/plans/plan-notice.ts';
import { NOTICE_KIND_INFO } from '../../../shared/notices/kinds.ts';
import type { AppConfig } from '../../config.ts';
import { inTransaction } from '../../lib/db.ts';
import { logger } from '../../lib/logger.ts';
import { htmlMessage, type Mailer } from '../../lib/mailer.ts';
import { unsubscribeHeaders, unsubscribeLinks } from '../notices/index.ts';
import { findUserById } from '../users/index.ts';
import { findRunnersWithFinishedBursts, lockUnnoticedChangesOf, markChangesNoticed } from './prescribe.repository.ts';

/**
 * The e-mail per editing burst (issue 15). A coach's changes are recorded with `noticed_at` empty
 * (plan-changes.service.ts); the sweep below sends each runner one message once nobody has changed
 * their plan for the quiet window, listing every change, and marks them noticed in the same
 * transaction. A runner who turned notices off gets nothing, and their changes are marked noticed
 * so turning it back on never sends an old backlog. Like every notice (issue 16), the e-mail carries
 * the RFC 8058 one-click unsubscribe headers for its kind, `plan_change`, and a link to the page.
 */

/** What the e-mail's links need: the public address, and the secret that signs unsubscribe links. */
export type PlanNoticeConfig = Pick<AppConfig, 'publicUrl' | 'jwtSecret'>;

const QUIET_MS = PLAN_NOTICE_QUIET_MINUTES * 60_000;
/** A coach editing without a pause for this long still gets the runner a message (then a new burst starts). */
export const PLAN_NOTICE_LONGEST_BURST_MINUTES = 60;
const LONGEST_MS = PLAN_NOTICE_LONGEST_BURST_MINUTES * 60_000;
/** How often the server looks for finished bursts: a notice leaves 10–11 minutes after the last change. */
export const PLAN_NOTICE_SWEEP_MS = 60_000;
/** Runners handled per sweep; the rest wait for the next one. */
const RUNNERS_PER_SWEEP = 200;

/** Runners whose unnoticed changes form a finished burst at `now`. */
function findRunnersDue(now: Date): Promise<string[]> {
  return findRunnersWithFinishedBursts(
    new Date(now.getTime() - QUIET_MS),
    new Date(now.getTime() - LONGEST_MS),
    RUNNERS_PER_SWEEP,
  );
}

/**
 * Sends the notice of one runner's finished burst, or marks it noticed without a message when the
 * runner turned notices off. Rows are locked (SKIP LOCKED), so two server processes never send the
 * same burst twice; a failed send rolls back and the next sweep tries again.
 */
async function noticeRunner(
  runnerId: string,
  mailer: Mailer,
  config: PlanNoticeConfig,
  now: Date,
): Promise<'sent' | 'off' | 'skipped'> {
  return inTransaction(async (trx) => {
    const changes = await lockUnnoticedChangesOf(runnerId, trx);
    if (changes.length === 0) return 'skipped';
    // A change made since the runner was picked reopens the burst.
    const last = Math.max(...changes.map((c) => c.created_at.getTime()));
    const first = Math.min(...changes.map((c) => c.created_at.getTime()));
    if (last > now.getTime() - QUIET_MS && first > now.getTime() - LONGEST_MS) return 'skipped';
    const runner = await findUserById(runnerId, trx);
    await markChangesNoticed(
      changes.map((c) => c.id),
      now,
      trx,
    );
    if (!runner?.notify_on_plan_change) return 'off';
    const notice = planChangeNotice(changes, runner.week_starts_on);
    const link = `${config.publicUrl}/plan?week=${notice.first_week}`;
    const offPage = unsubscribeLinks(config, runnerId, 'plan_change', now).page;
    const why = `You get this e-mail because “${NOTICE_KIND_INFO.plan_change.label}” is on in your profile.`;
    const off = `${why} Turn these e-mails off: ${offPage}`;
    await mailer.send({
      to: runner.email,
      subject: notice.subject,
      text: `${notice.intro}\n\n${notice.lines.join('\n')}\n\nOpen your plan: ${link}\n\n--\n${off}\n`,
      // The way out is a link in the HTML (the text part keeps the address).
      html: htmlMessage(
        notice.intro,
        notice.lines,
        { href: link, label: 'Open your plan' },
        { text: why, href: offPage, label: 'Turn these e-mails off' },
      ),
      headers: unsubscribeHeaders(config, runnerId, 'plan_change', now),
    });
    return 'sent';
  });
}

/** One sweep: every finished burst at `now` gets its notice. Returns how many messages were sent. */
export async function sendPlanChangeNotices(mailer: Mailer, config: PlanNoticeConfig, now = new Date()): Promise<number> {
  let sent = 0;
  for (const runnerId of await findRunnersDue(now)) {
    try {
      if ((await noticeRunner(runnerId, mailer, config, now)) === 'sent') sent += 1;
    } catch (err) {
      logger.warn({ err, runner: runnerId }, 'could not send a plan change notice; the next sweep tries again');
    }
  }
  return sent;
}

export interface PlanNoticeSweeper {
  stop(): Promise<void>;
}

/** Runs the sweep every minute in the background (server start); never keeps the process alive on its own. */
export function startPlanNoticeSweeper(
  mailer: Mailer,
  config: PlanNoticeConfig,
  everyMs = PLAN_NOTICE_SWEEP_MS,
): PlanNoticeSweeper {
  let stopped = false;
  let timer: NodeJS.Timeout | undefined;
  let running: Promise<unknown> = Promise.resolve();
  const schedule = () => {
    if (stopped) return;
    timer = setTimeout(() => {
      running = sendPlanChangeNotices(mailer, config)
        .catch((err: unknown) => logger.error({ err }, 'the plan notice sweep failed; it will be tried again'))
        .finally(schedule);
    }, everyMs);
    timer.unref();
  };
  schedule();
  return {
    async stop() {
      stopped = true;
      clearTimeout(timer);
      await running;
    },
  };
}
