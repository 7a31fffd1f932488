import { Router } from 'express';
import { auditExportQuery, auditListQuery } from '@shared/schemas/audit';
import { route, streamed } from '../lib/route';
import { can } from '../policy/index';
import { exportAuditCsv, listAudit } from '../services/audit';

export const auditRouter = Router();

auditRouter.get(
  '/',
  can('audit:read'),
  route({ query: auditListQuery }, ({ deps, actor, query }) => listAudit(deps.db, actor, query)),
);
auditRouter.get(
  '/export',
  can('audit:read'),
  route({ query: auditExportQuery }, ({ deps, actor, query }) => {
    const csv = exportAuditCsv(deps.db, actor, query, deps.clock());
    return streamed(
      {
        'Content-Type': 'text/csv; charset=utf-8',
        'Content-Disposition': `attachment; filename="${csv.fileName}"`,
      },
      csv.lines,
    );
  }),
);
