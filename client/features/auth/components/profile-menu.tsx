import { useEffect, useId, useRef, useState } from 'react';
import { Link, useLocation } from 'react-router-dom';
import type { User } from '../../../../shared/users/schemas.ts';
import { hasPermission } from '../../../../shared/auth/permissions.ts';
import { paths } from '../../../config/paths.ts';
import { useSignOut } from '../api/sign-out.ts';

const ITEM_CLASSES = 'block w-full rounded px-3 py-2 text-left hover:bg-teal-wash hover:text-teal-deep';

/** A disclosure rather than an ARIA menu: plain links and a button, reachable with Tab, closed with Escape. */
export function ProfileMenu({ user }: { user: User }) {
  const location = useLocation();
  // Remembering which page the menu was opened on closes it on any navigation without an effect.
  const [openOn, setOpenOn] = useState<string | null>(null);
  const open = openOn === location.key;
  const containerRef = useRef<HTMLDivElement>(null);
  const buttonRef = useRef<HTMLButtonElement>(null);
  const menuId = useId();
  const signOut = useSignOut();

  useEffect(() => {
    if (!open) return;
    function onPointerDown(event: PointerEvent) {
      if (!containerRef.current?.contains(event.target as Node)) setOpenOn(null);
    }
    function onKeyDown(event: KeyboardEvent) {
      if (event.key !== 'Escape') return;
      setOpenOn(null);
      buttonRef.current?.focus();
    }
    document.addEventListener('pointerdown', onPointerDown);
    document.addEventListener('keydown', onKeyDown);
    return () => {
      document.removeEventListener('pointerdown', onPointerDown);
      document.removeEventListener('keydown', onKeyDown);
    };
  }, [open]);

  return (
    <div ref={containerRef} className="relative">
      <button
        ref={buttonRef}
        type="button"
        aria-expanded={open}
        aria-controls={menuId}
        onClick={() => setOpenOn(open ? null : location.key)}
        className="flex min-h-11 items-center gap-2 rounded-md px-2 py-1 font-semibold hover:bg-card sm:min-h-9"
      >
        <span className="sr-only">Account menu for </span>
        <span className="max-w-32 truncate">{user.name}</span>
        <span aria-hidden="true" className="text-xs text-ink-muted">
          {open ? '▴' : '▾'}
        </span>
      </button>
      <div
        id={menuId}
        hidden={!open}
        className="absolute top-full right-0 z-30 mt-1 w-56 rounded-lg border border-line bg-card p-1 shadow-lg"
      >
        <p className="truncate px-3 pt-1.5 pb-2 text-sm text-ink-muted">{user.email}</p>
        <ul>
          <li>
            <Link to={paths.profile.getHref()} className={ITEM_CLASSES}>
              Profile
            </Link>
          </li>
          {hasPermission(user.role, 'users:manage') && (
            <li>
              <Link to={paths.admin.getHref()} className={ITEM_CLASSES}>
                Admin
              </Link>
            </li>
          )}
          <li className="mt-1 border-t border-line pt-1">
            <button type="button" className={ITEM_CLASSES} disabled={signOut.isPending} onClick={() => signOut.mutate()}>
              {signOut.isPending ? 'Signing out…' : 'Sign out'}
            </button>
          </li>
        </ul>
        {signOut.isError && (
          <p role="alert" className="px-3 py-2 text-sm text-tartan">
            {signOut.error.message}
          </p>
        )}
      </div>
    </div>
  );
}
