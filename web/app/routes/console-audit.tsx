import { Page } from '../../components/page';
import { AuditTrail } from '../../features/audit/components/audit-trail';

export function ConsoleAuditRoute() {
  return (
    <Page
      title="Audit trail"
      description="Who signed in, who changed people, limits and devices, and who downloaded readings — with when and from where."
    >
      <title>Audit trail — Brinewatch</title>
      <AuditTrail />
    </Page>
  );
}
