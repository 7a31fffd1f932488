import { tankStyleLabels } from '@shared/parameters/limit-templates';
import type { TankDetail } from '@shared/schemas/tanks';
import { StatusReason, TankStatusBadge } from '../../../components/status-badges';
import { formatDay, formatNumber, formatVolume } from '../../../lib/format';
import { TankCover } from './tank-cover';

const waterLabels = { marine: 'Marine', fresh: 'Freshwater', brackish: 'Brackish' } as const;

function Fact({ term, children }: { term: string; children: React.ReactNode }) {
  return (
    <div className="min-w-0">
      <dt className="text-sm font-bold text-ink-700">{term}</dt>
      <dd className="mt-0.5 text-ink-950">{children}</dd>
    </div>
  );
}

/** The tank at a glance: its photo, its status and what the company knows about it. */
export function TankOverview({ tank }: { tank: TankDetail }) {
  const { dimensions } = tank;
  return (
    <section aria-labelledby="overview-title" className="overflow-hidden rounded-card bg-white shadow-card">
      <div className="grid md:grid-cols-[minmax(0,5fr)_minmax(0,6fr)]">
        <div className="aspect-[3/2] md:aspect-auto md:min-h-72">
          <TankCover
            photo={tank.coverPhoto}
            size="full"
            alt={tank.coverPhoto?.caption ?? `Photo of ${tank.name}`}
          />
        </div>
        <div className="p-5">
          <div className="flex flex-wrap items-center justify-between gap-3">
            <h2 id="overview-title" className="text-xl font-bold text-ink-900">
              Overview
            </h2>
            <TankStatusBadge status={tank.status} />
          </div>
          <StatusReason reason={tank.statusReason} className="mt-2" />
          <dl className="mt-4 grid grid-cols-2 gap-x-4 gap-y-3">
            <Fact term="Style">{tankStyleLabels[tank.style]}</Fact>
            <Fact term="Water">{waterLabels[tank.waterType]}</Fact>
            <Fact term="Display">{formatVolume(tank.displayVolumeL)}</Fact>
            <Fact term="Sump">{tank.sumpVolumeL > 0 ? formatVolume(tank.sumpVolumeL) : 'No sump'}</Fact>
            {dimensions && (
              <Fact term="Size (L × W × H)">
                {formatNumber(dimensions.lengthCm)} × {formatNumber(dimensions.widthCm)} ×{' '}
                {formatNumber(dimensions.heightCm)} cm
              </Fact>
            )}
            <Fact term="Set up">{formatDay(tank.setUpOn)}</Fact>
            <Fact term="Technician">{tank.assignedTechnician?.name ?? 'Not assigned yet'}</Fact>
            <Fact term="Visits">Every {tank.serviceIntervalDays} days</Fact>
            <Fact term="Owners">
              {tank.owners.length > 0 ? tank.owners.map((owner) => owner.name).join(', ') : 'None yet'}
            </Fact>
            <Fact term="Time zone">{tank.effectiveTimeZone.replaceAll('_', ' ')}</Fact>
          </dl>
          {tank.notes && (
            <div className="mt-4 rounded-lg bg-sand-100 p-3">
              <h3 className="text-sm font-bold text-ink-700">Notes from {tank.company.name}</h3>
              <p className="mt-1 whitespace-pre-line text-ink-950">{tank.notes}</p>
            </div>
          )}
        </div>
      </div>
    </section>
  );
}
