import { useEffect, useId, useRef, useState } from 'react';
import { useLocation } from 'react-router';
import { Button } from '../../../components/button';
import { signInUrl, useMe } from '../../../lib/auth';
import { useSignOut } from '../api/sign-out';

const roleLabel = { owner: 'Tank owner', technician: 'Technician', admin: 'Admin' } as const;

function PersonIcon() {
  return (
    <svg viewBox="0 0 24 24" className="h-6 w-6" aria-hidden="true" focusable="false">
      <circle cx="12" cy="8.5" r="4" fill="none" stroke="currentColor" strokeWidth="1.8" />
      <path
        d="M4.5 20c1.2-3.6 4-5.5 7.5-5.5s6.3 1.9 7.5 5.5"
        fill="none"
        stroke="currentColor"
        strokeWidth="1.8"
      />
    </svg>
  );
}

/**
 * Who is signed in, and the way out; or the way in. On a phone the name and the way out fold
 * behind one account button, so the header stays a single row.
 */
export function UserMenu() {
  const me = useMe();
  const signOut = useSignOut();
  // Open on the page where it was opened: moving to another page closes it.
  const { key: here } = useLocation();
  const [openOn, setOpenOn] = useState<string | null>(null);
  const open = openOn === here;
  const setOpen = (next: boolean) => setOpenOn(next ? here : null);
  const panelId = useId();
  const wrapperRef = useRef<HTMLDivElement>(null);
  useEffect(() => {
    if (!open) return;
    const onKey = (event: KeyboardEvent) => {
      if (event.key === 'Escape') setOpenOn(null);
    };
    const onPointer = (event: PointerEvent) => {
      if (!wrapperRef.current?.contains(event.target as Node)) setOpenOn(null);
    };
    document.addEventListener('keydown', onKey);
    document.addEventListener('pointerdown', onPointer);
    return () => {
      document.removeEventListener('keydown', onKey);
      document.removeEventListener('pointerdown', onPointer);
    };
  }, [open]);

  if (me.isPending)
    return <span className="h-9 w-11 animate-pulse rounded bg-ink-800 sm:w-24" aria-hidden="true" />;
  if (!me.data) {
    return (
      <a
        href={signInUrl('/')}
        className="inline-flex min-h-11 shrink-0 items-center rounded-lg bg-brine-300 px-4 font-bold text-ink-950 no-underline hover:bg-brine-100"
      >
        Sign in
      </a>
    );
  }
  const signOutButton = (
    <Button
      tone="secondary"
      onClick={() => signOut.mutate()}
      disabled={signOut.isPending}
      className="text-sm"
    >
      {signOut.isPending ? 'Signing out…' : 'Sign out'}
    </Button>
  );
  return (
    <>
      <div className="hidden items-center gap-3 sm:flex">
        <div className="text-right leading-tight">
          <p className="text-sm font-bold text-white" data-testid="signed-in-name">
            {me.data.name}
          </p>
          <p className="text-xs text-ink-100">
            {roleLabel[me.data.role]} · {me.data.company.name}
          </p>
        </div>
        {signOutButton}
      </div>
      <div ref={wrapperRef} className="relative sm:hidden">
        <button
          type="button"
          aria-expanded={open}
          aria-controls={panelId}
          onClick={() => setOpen(!open)}
          className="inline-flex h-11 w-11 items-center justify-center rounded-lg text-white hover:bg-ink-800"
        >
          <PersonIcon />
          <span className="sr-only">Account</span>
        </button>
        {open && (
          <div
            id={panelId}
            className="absolute right-0 top-full z-40 mt-2 w-64 rounded-card bg-white p-4 text-ink-950 shadow-card"
          >
            <p className="font-bold">{me.data.name}</p>
            <p className="text-sm text-ink-700">
              {roleLabel[me.data.role]} · {me.data.company.name}
            </p>
            <div className="mt-3">{signOutButton}</div>
          </div>
        )}
      </div>
    </>
  );
}
