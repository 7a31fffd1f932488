import { useState } from 'react';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { FieldError } from '../../../components/field-error';
import { problemMessage } from '../../../lib/problem-message';
import { useDeactivateUser } from '../api/deactivate-user';
import { useReactivateUser } from '../api/reactivate-user';

interface Person {
  id: string;
  name: string;
  status: 'active' | 'deactivated';
}

/**
 * Deactivate (after a confirm step, because it signs the person out everywhere) or reactivate
 * (straight away: it only lets them sign in again). `onDone` receives a sentence to announce.
 */
export function AccountStatusAction({
  person,
  kept,
  onDone,
}: {
  person: Person;
  /** What stays in Brinewatch when the account is switched off, in the person's terms. */
  kept: string;
  onDone: (message: string) => void;
}) {
  const [confirming, setConfirming] = useState(false);
  const deactivate = useDeactivateUser();
  const reactivate = useReactivateUser();
  const active = person.status === 'active';

  const closeDialog = () => {
    setConfirming(false);
    deactivate.reset();
  };

  return (
    <>
      <Button
        tone="secondary"
        disabled={reactivate.isPending}
        onClick={() => {
          if (active) {
            reactivate.reset();
            setConfirming(true);
            return;
          }
          reactivate.mutate(person.id, {
            onSuccess: () => onDone(`${person.name} is active again and can sign in.`),
          });
        }}
      >
        {active ? 'Deactivate' : reactivate.isPending ? 'Reactivating…' : 'Reactivate'}
        <span className="sr-only"> {person.name}</span>
      </Button>
      {reactivate.isError && (
        <div role="alert" className="basis-full">
          <FieldError>{problemMessage(reactivate.error)}</FieldError>
        </div>
      )}
      <ConfirmDialog
        open={confirming}
        title={`Deactivate ${person.name}?`}
        confirmLabel="Deactivate"
        pendingLabel="Deactivating…"
        pending={deactivate.isPending}
        error={deactivate.isError ? problemMessage(deactivate.error) : undefined}
        onClose={closeDialog}
        onConfirm={() =>
          deactivate.mutate(person.id, {
            onSuccess: () => {
              closeDialog();
              onDone(`${person.name} is deactivated and signed out everywhere.`);
            },
          })
        }
      >
        <p>
          All of their sessions end at once, on every device, and they cannot sign in again until the account
          is reactivated.
        </p>
        <p>{kept}</p>
      </ConfirmDialog>
    </>
  );
}
