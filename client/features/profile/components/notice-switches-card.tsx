import { noticeKindsFor } from '../../../../shared/notices/kinds.ts';
import type { Role } from '../../../../shared/users/schemas.ts';
import { Card } from '../../../components/ui/card.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { useNoticeSwitches } from '../api/notice-switches.ts';
import { NoticeSwitch } from './notice-switch.tsx';

/**
 * One switch per kind of notice e-mail the user can receive (issue 16; the kinds and their words are
 * in shared/notices/kinds.ts). Every notice also carries a one-click unsubscribe link for its kind.
 */
export function NoticeSwitchesCard({ role }: { role: Role }) {
  const switches = useNoticeSwitches();

  return (
    <Card
      title="E-mail notices"
      description="Choose which e-mails Pacewright sends you. Each one also has a link at the bottom that turns off just its kind."
    >
      {switches.isPending && <p className="text-ink-muted">Loading…</p>}
      {switches.error && <FormAlert>{switches.error.message}</FormAlert>}
      {switches.data && (
        <ul className="flex flex-col gap-4">
          {noticeKindsFor(role).map((kind) => (
            <NoticeSwitch key={kind} kind={kind} on={switches.data[kind]} />
          ))}
        </ul>
      )}
      <p className="mt-4 text-sm text-ink-muted">
        Invitations to a squad and password-reset e-mails are always sent: you asked for them, so no switch stops them.
      </p>
    </Card>
  );
}
