import { formatDate } from '../../../lib/format';
import type { CreatedInvitation } from '../api/create-invitation';

/**
 * What happened to the last invitation. Both live regions stay in the page so that what
 * appears in them is read out.
 */
export function InvitationOutcome({ outcome }: { outcome: CreatedInvitation | null }) {
  const sent = outcome?.emailSent ? outcome : null;
  const unsent = outcome && !outcome.emailSent ? outcome : null;
  return (
    <>
      <div role="status">
        {sent && (
          <p className="rounded-lg bg-healthy-100 p-3 text-sm font-bold text-healthy-700">
            Invitation sent to {sent.email}. The link works once, until {formatDate(sent.expiresAt)}.
          </p>
        )}
      </div>
      <div role="alert">
        {unsent && (
          <div className="rounded-lg border border-watch-700/40 bg-watch-100 p-3 text-sm text-watch-700">
            <p className="font-bold">The e-mail to {unsent.email} could not be sent.</p>
            <p className="mt-1">
              The invitation exists and is listed under Invitations. Try again later, or revoke it there if it
              is no longer needed.
            </p>
          </div>
        )}
      </div>
    </>
  );
}
