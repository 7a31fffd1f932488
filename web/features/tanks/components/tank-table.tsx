import { Link } from 'react-router';
import { tankStyleLabels } from '@shared/parameters/limit-templates';
import type { TankSummary } from '@shared/schemas/tanks';
import { Badge } from '../../../components/badge';
import { TankStatusBadge } from '../../../components/status-badges';
import { formatDate, formatVolume } from '../../../lib/format';
import { TankCover } from './tank-cover';

const linkClass = 'inline-flex min-h-11 items-center font-bold text-brine-700';
/** A 44-px target however short its word (WCAG 2.2 target size). */
const editClass = `${linkClass} min-w-11 justify-center rounded-lg px-3 hover:bg-ink-50`;

/** Past the tank's service interval since its last visit; a clock face beside the words. */
function OverdueBadge() {
  return (
    <Badge
      tone="border border-watch-700/30 bg-watch-100 text-watch-700"
      mark={
        <svg viewBox="0 0 16 16" className="h-4 w-4" focusable="false">
          <circle cx="8" cy="8" r="6.5" fill="none" stroke="currentColor" strokeWidth="2" />
          <path
            d="M8 4.5V8l2.5 1.5"
            fill="none"
            stroke="currentColor"
            strokeWidth="2"
            strokeLinecap="round"
          />
        </svg>
      }
    >
      Overdue for service
    </Badge>
  );
}

const lastVisit = (tank: TankSummary) => (tank.lastVisitAt ? formatDate(tank.lastVisitAt) : 'none yet');

/** The console's list: one row per tank with its clients, as cards on a phone and a table on a desk. */
export function TankTable({ tanks }: { tanks: readonly TankSummary[] }) {
  return (
    <>
      <ul className="space-y-3 md:hidden">
        {tanks.map((tank) => (
          <li key={tank.id} className="flex gap-3 rounded-card bg-white p-3 shadow-card">
            <div className="h-20 w-24 shrink-0 overflow-hidden rounded-lg">
              <TankCover photo={tank.coverPhoto} />
            </div>
            <div className="min-w-0 flex-1">
              <div className="flex flex-wrap items-start justify-between gap-2">
                <Link to={`/tanks/${tank.id}`} className={`${linkClass} text-lg leading-snug`}>
                  {tank.name}
                </Link>
                <TankStatusBadge status={tank.status} />
              </div>
              {tank.visitOverdue && (
                <div className="mt-1">
                  <OverdueBadge />
                </div>
              )}
              {tank.siteLabel && <p className="text-sm text-ink-700">{tank.siteLabel}</p>}
              <dl className="mt-1 text-sm">
                <div className="flex gap-1">
                  <dt className="font-bold text-ink-700">Client:</dt>
                  <dd className="text-ink-950">
                    {tank.owners.map((owner) => owner.name).join(', ') || 'none yet'}
                  </dd>
                </div>
                <div className="flex gap-1">
                  <dt className="font-bold text-ink-700">Technician:</dt>
                  <dd className="text-ink-950">{tank.assignedTechnician?.name ?? 'nobody assigned'}</dd>
                </div>
                <div className="flex gap-1">
                  <dt className="font-bold text-ink-700">Last visit:</dt>
                  <dd className="text-ink-950">{lastVisit(tank)}</dd>
                </div>
              </dl>
              <Link
                to={`/console/tanks/${tank.id}/edit`}
                className={`${editClass} -ml-3`}
                aria-label={`Edit ${tank.name}`}
              >
                Edit
              </Link>
            </div>
          </li>
        ))}
      </ul>
      <div className="hidden overflow-hidden rounded-card bg-white shadow-card md:block">
        <table className="w-full text-left">
          <caption className="sr-only">Tanks and their clients</caption>
          <thead className="bg-ink-50 text-sm text-ink-700">
            <tr>
              <th scope="col" className="px-4 py-3 font-bold">
                Tank
              </th>
              <th scope="col" className="px-4 py-3 font-bold">
                Client
              </th>
              <th scope="col" className="px-4 py-3 font-bold">
                Technician
              </th>
              <th scope="col" className="px-4 py-3 font-bold">
                Status
              </th>
              <th scope="col" className="px-4 py-3 font-bold">
                <span className="sr-only">Actions</span>
              </th>
            </tr>
          </thead>
          <tbody className="divide-y divide-ink-100">
            {tanks.map((tank) => (
              <tr key={tank.id} className="align-top">
                <td className="px-4 py-3">
                  <div className="flex gap-3">
                    <div className="h-12 w-16 shrink-0 overflow-hidden rounded-md">
                      <TankCover photo={tank.coverPhoto} />
                    </div>
                    <div className="min-w-0">
                      <Link to={`/tanks/${tank.id}`} className="font-bold text-brine-700">
                        {tank.name}
                      </Link>
                      <p className="text-sm text-ink-700">
                        {tankStyleLabels[tank.style]} · {formatVolume(tank.displayVolumeL)}
                      </p>
                    </div>
                  </div>
                </td>
                <td className="px-4 py-3 text-sm">
                  <p className="font-bold text-ink-950">
                    {tank.owners.map((owner) => owner.name).join(', ') || 'No client yet'}
                  </p>
                  {tank.siteLabel && <p className="text-ink-700">{tank.siteLabel}</p>}
                </td>
                <td className="px-4 py-3 text-sm text-ink-950">
                  <p>{tank.assignedTechnician?.name ?? 'Nobody assigned'}</p>
                  <p className="text-ink-700">Last visit: {lastVisit(tank)}</p>
                </td>
                <td className="whitespace-nowrap px-4 py-3">
                  <div className="flex flex-col items-start gap-1">
                    <TankStatusBadge status={tank.status} />
                    {tank.visitOverdue && <OverdueBadge />}
                  </div>
                </td>
                <td className="px-4 py-3 text-right">
                  <Link
                    to={`/console/tanks/${tank.id}/edit`}
                    className={editClass}
                    aria-label={`Edit ${tank.name}`}
                  >
                    Edit
                  </Link>
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </>
  );
}
