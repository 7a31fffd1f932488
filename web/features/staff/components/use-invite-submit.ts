import { useEffect, useRef, useState } from 'react';
import { createInvitationInput } from '@shared/schemas/invitations';
import { ApiError } from '../../../lib/api-client';
import { groupIssues, problemMessage, type FormIssues } from '../../../lib/form-issues';
import { useCreateInvitation, type CreatedInvitation } from '../api/create-invitation';

const noIssues: FormIssues = { fields: {}, other: [] };

/**
 * The submit story both invitation forms share: check with the same schema the API uses, send,
 * put any 400 issues beside their fields and move focus to the first field that needs attention.
 */
export function useInviteSubmit(knownFields: readonly string[]) {
  const invite = useCreateInvitation();
  const formRef = useRef<HTMLFormElement>(null);
  const [issues, setIssues] = useState<FormIssues>(noIssues);
  const [outcome, setOutcome] = useState<CreatedInvitation | null>(null);

  useEffect(() => {
    if (Object.keys(issues.fields).length === 0) return;
    formRef.current?.querySelector<HTMLElement>('[aria-invalid="true"]')?.focus();
  }, [issues]);

  function submit(input: Record<string, unknown>, onSent: () => void) {
    setOutcome(null);
    const checked = createInvitationInput.safeParse(input);
    if (!checked.success) {
      const found = checked.error.issues.map((issue) => ({
        path: issue.path.map(String).join('.'),
        message: issue.message,
      }));
      setIssues(groupIssues(found, knownFields));
      return;
    }
    setIssues(noIssues);
    invite.mutate(checked.data, {
      onSuccess: (created) => {
        setOutcome(created);
        onSent();
      },
      onError: (error) => {
        if (error instanceof ApiError && error.status === 400 && error.issues.length > 0) {
          setIssues(groupIssues(error.issues, knownFields));
        } else {
          setIssues({ fields: {}, other: [problemMessage(error)] });
        }
      },
    });
  }

  return { formRef, submit, issues, outcome, pending: invite.isPending };
}
