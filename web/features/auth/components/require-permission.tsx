import { useEffect, type ReactNode } from 'react';
import { Link, Outlet } from 'react-router';
import type { Permission } from '@shared/people/permissions';
import { ErrorState, LoadingState } from '../../../components/states';
import { can, signInUrl, useMe } from '../../../lib/auth';

/**
 * Guards an area of the app by what the person may do there (the API's own permission for it);
 * signed-out visitors go to sign in and come back.
 */
export function RequirePermission({
  permission,
  children,
}: {
  permission: Permission;
  children?: ReactNode;
}) {
  const me = useMe();
  const signedOut = me.isSuccess && me.data === null;
  useEffect(() => {
    if (signedOut) window.location.assign(signInUrl());
  }, [signedOut]);

  if (me.isPending || signedOut) {
    return (
      <div className="mx-auto max-w-6xl px-4 py-8">
        <LoadingState label={signedOut ? 'Taking you to sign in…' : 'Checking who you are…'} />
      </div>
    );
  }
  if (me.isError) {
    return (
      <div className="mx-auto max-w-6xl px-4 py-8">
        <ErrorState error={me.error} what="your account" onRetry={() => void me.refetch()} />
      </div>
    );
  }
  if (!can(me.data, permission)) {
    return (
      <section className="mx-auto max-w-xl px-4 py-16 text-center" aria-labelledby="wrong-area-title">
        <h1 id="wrong-area-title" className="text-2xl font-bold text-ink-900">
          This part of Brinewatch is not for your account
        </h1>
        <p className="mt-3 text-ink-700">You are signed in as {me.data!.name}.</p>
        <Link to="/" className="mt-6 inline-block font-bold text-brine-700">
          Go to your start page
        </Link>
      </section>
    );
  }
  return children ?? <Outlet />;
}
