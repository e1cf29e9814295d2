import { ROLES, type AdminUser, type Role } from '../../../../shared/users/schemas.ts';
import { CONTROL_CLASSES } from '../../../components/ui/field.tsx';
import { FormAlert } from '../../../components/ui/form-alert.tsx';
import { cn } from '../../../lib/cn.ts';
import { formatOnDevice } from '../../../lib/format.ts';
import { DeviceClockNote } from '../../../components/ui/zoned-time.tsx';
import { useHeldChoice } from '../../../lib/use-held-choice.ts';
import { useChangeUserRole } from '../api/change-user-role.ts';
import { useUsers } from '../api/get-users.ts';

const ROLE_LABELS: Record<Role, string> = { runner: 'Runner', coach: 'Coach', admin: 'Admin' };

/** Everyone with an account; an admin's own row is read-only so nobody removes the last way back in by accident. */
export function UsersTable({ currentUserId }: { currentUserId: string }) {
  const users = useUsers();
  const changeRole = useChangeUserRole();
  const failedUser = changeRole.isError && users.find((u) => u.id === changeRole.variables.id);

  return (
    <div className="flex flex-col gap-3">
      {failedUser && (
        <FormAlert>
          The role of {failedUser.name} was not changed: {changeRole.error.message}
        </FormAlert>
      )}
      {changeRole.isSuccess && (
        <p role="status" className="text-sm text-ink-muted">
          {changeRole.data.name} is now {ROLE_LABELS[changeRole.data.role].toLowerCase()}.
        </p>
      )}
      <div className="relative overflow-x-auto">
        <table className="w-full text-left text-sm sm:min-w-xl">
          <caption className="sr-only">Accounts and their roles</caption>
          <thead className="border-b border-line text-ink-muted">
            <tr>
              <th scope="col" className="py-1.5 pr-3 font-semibold">
                Name
              </th>
              <th scope="col" className="hidden py-1.5 pr-3 font-semibold sm:table-cell">
                E-mail
              </th>
              <th scope="col" className="py-1.5 pr-3 font-semibold">
                Role
              </th>
              <th scope="col" className="hidden py-1.5 font-semibold sm:table-cell">
                Joined
              </th>
            </tr>
          </thead>
          <tbody>
            {users.map((user) => (
              <UserRow
                key={user.id}
                user={user}
                isSelf={user.id === currentUserId}
                saving={changeRole.isPending && changeRole.variables.id === user.id}
                onChangeRole={(role, onError) => changeRole.mutate({ id: user.id, role }, { onError })}
              />
            ))}
          </tbody>
        </table>
      </div>
      <DeviceClockNote className="text-xs text-ink-muted" />
    </div>
  );
}

type UserRowProps = {
  user: AdminUser;
  isSelf: boolean;
  saving: boolean;
  onChangeRole: (role: Role, onError: () => void) => void;
};

function UserRow({ user, isSelf, saving, onChangeRole }: UserRowProps) {
  // The chosen role shows in the same render as the choice (the mutation's pending state comes a tick
  // later) and while it is saved; a refused change falls back to the saved role.
  const { shown: role, hold, release } = useHeldChoice(user.role);
  return (
    <tr className="border-b border-line last:border-0">
      <th scope="row" className="py-2 pr-3 font-semibold" data-primary="">
        {user.name}
        {isSelf && <span className="ml-1 font-normal text-ink-muted">(you)</span>}
        {/* Phones: e-mail and joining date under the name instead of in their own columns. */}
        <span className="block font-normal break-all text-ink-muted sm:hidden">{user.email}</span>
        <span className="block font-normal text-ink-muted sm:hidden">joined {formatOnDevice(user.created_at)}</span>
      </th>
      <td className="hidden py-2 pr-3 break-all sm:table-cell">{user.email}</td>
      <td className="py-2 pr-3" data-primary="">
        <select
          aria-label={`Role of ${user.name}`}
          value={role}
          disabled={isSelf || saving}
          onChange={(event) => {
            const chosen = event.target.value as Role;
            hold(chosen);
            onChangeRole(chosen, release);
          }}
          className={cn(CONTROL_CLASSES, 'px-2 py-1 text-sm disabled:bg-paper')}
        >
          {ROLES.map((role) => (
            <option key={role} value={role}>
              {ROLE_LABELS[role]}
            </option>
          ))}
        </select>
      </td>
      <td className="hidden py-2 sm:table-cell">{formatOnDevice(user.created_at)}</td>
    </tr>
  );
}
