import { useState } from 'react';
import type { CareTip } from '@shared/schemas/care-tips';
import { Button } from '../../../components/button';
import { ConfirmDialog } from '../../../components/confirm-dialog';
import { problemMessage } from '../../../lib/problem-message';
import { useWithdrawCareTip } from '../api/send-care-tip';

/** Takes a sent or scheduled tip back, after saying what that does and does not undo. */
export function WithdrawTip({
  tip,
  onDone,
}: {
  tip: Pick<CareTip, 'id' | 'title' | 'status'>;
  onDone: (message: string) => void;
}) {
  const [open, setOpen] = useState(false);
  const withdraw = useWithdrawCareTip();
  const close = () => {
    setOpen(false);
    withdraw.reset();
  };
  return (
    <>
      <Button tone="secondary" onClick={() => setOpen(true)}>
        Withdraw<span className="sr-only"> “{tip.title}”</span>
      </Button>
      <ConfirmDialog
        open={open}
        title={`Withdraw “${tip.title}”?`}
        confirmLabel="Withdraw the tip"
        pendingLabel="Withdrawing…"
        pending={withdraw.isPending}
        error={withdraw.isError ? problemMessage(withdraw.error) : undefined}
        onClose={close}
        onConfirm={() =>
          withdraw.mutate(tip.id, {
            onSuccess: () => {
              close();
              onDone(`“${tip.title}” is withdrawn.`);
            },
          })
        }
      >
        {tip.status === 'scheduled' ? (
          <p>It will not be sent. You cannot send it again afterwards.</p>
        ) : (
          <>
            <p>It disappears from owners’ feeds; what was sent stays recorded.</p>
            <p>Notifications already delivered are not taken back.</p>
          </>
        )}
      </ConfirmDialog>
    </>
  );
}
