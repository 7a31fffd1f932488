import { Link } from 'react-router';
import { tankStyleLabels } from '@shared/parameters/limit-templates';
import type { TankSummary } from '@shared/schemas/tanks';
import { TankStatusBadge } from '../../../components/status-badges';
import { formatVolume } from '../../../lib/format';
import { TankCover } from './tank-cover';

/** One tank on the owner's dashboard: the whole card opens the tank page. */
export function TankCard({ tank }: { tank: TankSummary }) {
  return (
    <article className="relative flex h-full flex-col overflow-hidden rounded-card bg-white shadow-card focus-within:outline-3 focus-within:outline-offset-2 focus-within:outline-brine-500 hover:shadow-lg">
      <div className="aspect-[3/2] w-full">
        <TankCover photo={tank.coverPhoto} />
      </div>
      <div className="flex flex-1 flex-col gap-2 p-4">
        <div className="flex flex-wrap items-start justify-between gap-2">
          <h2 className="text-lg font-bold text-ink-900">
            <Link
              to={`/tanks/${tank.id}`}
              className="text-ink-900 no-underline after:absolute after:inset-0 after:content-[''] focus:outline-none"
            >
              {tank.name}
            </Link>
          </h2>
          <TankStatusBadge status={tank.status} />
        </div>
        {tank.siteLabel && <p className="text-sm text-ink-700">{tank.siteLabel}</p>}
        <p className="mt-auto text-sm text-ink-700">
          {tankStyleLabels[tank.style]} · {formatVolume(tank.displayVolumeL)}
        </p>
      </div>
    </article>
  );
}
