import { describeFee } from '../../fees/index.ts';
import type { InvitationPreview } from '../api/get-invitation.ts';

/** Who invites whom to what, and what joining a squad means for the runner's data. */
export function InvitationSummary({ invitation }: { invitation: InvitationPreview }) {
  const coach = invitation.coach.name || 'A coach';
  return (
    <div className="flex flex-col gap-3">
      <h1 className="text-2xl font-bold">
        {coach} invites you to join {invitation.squad.name}
      </h1>
      <p className="text-sm text-ink-muted">
        Sent to <span className="font-semibold break-all text-ink">{invitation.email}</span>
      </p>
      <div>
        <h2 className="mb-1 font-semibold">What joining means</h2>
        <ul className="list-disc space-y-1 pl-5">
          <li>{coach} can read your runs, your session plans and your weeks, and may write session plans for you.</li>
          <li>You and {coach} can write notes on your runs; each of you sees the other’s.</li>
          <li>You can leave the squad any time from your profile page. From then on {coach} can no longer read your data.</li>
          {invitation.fee.kind !== 'none' && (
            <li data-testid="invitation-fee">
              This squad has a fee: <strong>{describeFee(invitation.fee)}</strong>. You pay it by card on the payment service’s
              own page after joining, and can cancel at the end of any paid period.
            </li>
          )}
        </ul>
      </div>
    </div>
  );
}
