import { Button } from '../../../components/button';
import { signInUrl, useMe } from '../../../lib/auth';
import { useSignOut } from '../api/sign-out';

const roleLabel = { owner: 'Tank owner', technician: 'Technician', admin: 'Admin' } as const;

/** Who is signed in, and the way out; or the way in. */
export function UserMenu() {
  const me = useMe();
  const signOut = useSignOut();
  if (me.isPending) return <span className="h-9 w-24 animate-pulse rounded bg-ink-800" aria-hidden="true" />;
  if (!me.data) {
    return (
      <a
        href={signInUrl('/')}
        className="min-h-11 rounded-lg bg-brine-300 px-4 py-2 font-bold text-ink-950 no-underline hover:bg-brine-100"
      >
        Sign in
      </a>
    );
  }
  return (
    <div className="flex items-center gap-3">
      <div className="text-right leading-tight">
        <p className="text-sm font-bold text-white" data-testid="signed-in-name">
          {me.data.name}
        </p>
        <p className="text-xs text-ink-100">
          {roleLabel[me.data.role]} · {me.data.company.name}
        </p>
      </div>
      <Button
        tone="secondary"
        onClick={() => signOut.mutate()}
        disabled={signOut.isPending}
        className="text-sm"
      >
        {signOut.isPending ? 'Signing out…' : 'Sign out'}
      </Button>
    </div>
  );
}
