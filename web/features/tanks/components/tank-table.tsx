import { Link } from 'react-router';
import { tankStyleLabels } from '@shared/parameters/limit-templates';
import type { TankSummary } from '@shared/schemas/tanks';
import { TankStatusBadge } from '../../../components/status-badges';
import { formatVolume } from '../../../lib/format';
import { TankCover } from './tank-cover';

const linkClass = 'inline-flex min-h-11 items-center font-bold text-brine-700';
/** A 44-px target however short its word (WCAG 2.2 target size). */
const editClass = `${linkClass} min-w-11 justify-center rounded-lg px-3 hover:bg-ink-50`;

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
                  {tank.assignedTechnician?.name ?? 'Nobody assigned'}
                </td>
                <td className="whitespace-nowrap px-4 py-3">
                  <TankStatusBadge status={tank.status} />
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
