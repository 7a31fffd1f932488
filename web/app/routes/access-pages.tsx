import { useQuery } from '@tanstack/react-query';
import { Link } from 'react-router';
import { api } from '../../lib/api-client';

interface AccessInfo {
  signedIn: boolean;
  noAccess: { email: string | null; name: string | null; reason: string } | null;
}

function Notice({ title, children }: { title: string; children: React.ReactNode }) {
  return (
    <section className="mx-auto max-w-xl px-4 py-16" aria-labelledby="notice-title">
      <div className="rounded-card bg-white p-6 shadow-card sm:p-8">
        <h1 id="notice-title" className="text-2xl font-bold text-ink-900">
          {title}
        </h1>
        <div className="mt-3 space-y-3 text-ink-700">{children}</div>
      </div>
    </section>
  );
}

/** Signed in at the identity provider, but nobody here has invited this person yet. */
export function NoAccessRoute() {
  const access = useQuery({ queryKey: ['me', 'access'], queryFn: () => api<AccessInfo>('/me/access') });
  const who = access.data?.noAccess;
  const deactivated = who?.reason === 'deactivated';
  return (
    <Notice title={deactivated ? 'This account has been switched off' : 'No access yet'}>
      {who?.email && (
        <p>
          You signed in as <strong className="text-ink-900">{who.email}</strong>.
        </p>
      )}
      {deactivated ? (
        <p>
          Your service company has deactivated this account. If you think that is a mistake, contact them.
        </p>
      ) : who?.reason === 'invitation-invalid' ? (
        <p>
          The invitation you followed has expired or has already been used. Ask your service company to send a
          new one.
        </p>
      ) : (
        <p>
          Brinewatch opens once your aquarium service company invites you. Ask them to send an invitation to
          the address above, then follow the link in that e-mail.
        </p>
      )}
      <Link to="/" className="inline-block font-bold text-brine-700">
        Back to the start page
      </Link>
    </Notice>
  );
}

export function SignInProblemRoute() {
  return (
    <Notice title="Sign-in did not finish">
      <p>
        The sign-in could not be verified — the link may have been used already, or it took too long. Nothing
        was changed. Please try again.
      </p>
      <a
        href="/auth/login"
        className="inline-block min-h-11 rounded-lg bg-brine-700 px-4 py-2.5 font-bold text-white no-underline"
      >
        Sign in again
      </a>
    </Notice>
  );
}

export function InvitationInvalidRoute() {
  return (
    <Notice title="This invitation link no longer works">
      <p>
        Invitation links work once and expire after a few days. If you have already accepted it, just sign in.
        Otherwise ask your service company to send a new invitation.
      </p>
      <a
        href="/auth/login"
        className="inline-block min-h-11 rounded-lg bg-brine-700 px-4 py-2.5 font-bold text-white no-underline"
      >
        Sign in
      </a>
    </Notice>
  );
}
