import { Link, useNavigate } from 'react-router';
import { Button } from './button';
import { FieldError } from './field-error';
import { ApiError } from '../lib/api-client';
import { problemMessage } from '../lib/problem-message';
import { useDraftInvoice } from '../lib/queries/draft-invoice';
import type { NewInvoiceInput } from '@shared/schemas/billing';

const uuid = /[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}/i;

/**
 * Admins: draft the invoice of a published visit report or a resolved urgent request, and open it. When one exists
 * already, the API's 409 names it; a link follows when its message carries the invoice's id.
 */
export function DraftInvoiceButton({ source }: { source: NewInvoiceInput }) {
  const navigate = useNavigate();
  const draft = useDraftInvoice();
  const error = draft.error;
  const existingId =
    error instanceof ApiError && error.code === 'already_invoiced'
      ? (uuid.exec(error.message)?.[0] ?? null)
      : null;
  return (
    <div className="grid gap-2 print:hidden">
      <Button
        tone="secondary"
        className="justify-self-start"
        disabled={draft.isPending}
        onClick={() =>
          draft.mutate(source, {
            onSuccess: (invoice) => void navigate(`/console/invoices/${invoice.id}`),
          })
        }
      >
        {draft.isPending ? 'Drafting…' : 'Draft invoice'}
      </Button>
      <div role="alert">
        {error && (
          <FieldError>
            {/* The id is for the link; people read the invoice's number. */}
            {existingId ? problemMessage(error).replace(` (${existingId})`, '') : problemMessage(error)}
            {existingId && (
              <>
                {' '}
                <Link to={`/console/invoices/${existingId}`} className="font-bold text-brine-700 underline">
                  Open that invoice
                </Link>
              </>
            )}
          </FieldError>
        )}
      </div>
    </div>
  );
}
