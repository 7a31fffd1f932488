import { useSearchParams } from 'react-router';
import { Page } from '../../components/page';
import { ConversationInbox } from '../../features/conversations/components/conversation-inbox';
import { inboxFilters, type InboxFilter } from '../../features/conversations/api/list-inbox';

const isFilter = (value: string | null): value is InboxFilter =>
  inboxFilters.some((filter) => filter === value);

/** Staff: every tank's conversation, those waiting for an answer first. */
export function ConsoleInboxRoute() {
  const [params] = useSearchParams();
  const asked = params.get('filter');
  return (
    <Page
      title="Inbox"
      description="Owners’ messages about their tanks. Those waiting for an answer come first, longest waiting at the top."
    >
      <ConversationInbox filter={isFilter(asked) ? asked : 'all'} />
    </Page>
  );
}
