import { useId } from 'react';
import { livestockGroupLabels } from '@shared/livestock/species';
import { tankStyleLabels } from '@shared/parameters/limit-templates';
import { triggerWords, type CareTip, type TipAudience } from '@shared/schemas/care-tips';
import { equipmentKindLabels } from '@shared/schemas/equipment';
import { visitTaskLabels } from '@shared/schemas/visits';
import { Markdown } from '../../../components/markdown';
import { SectionCard } from '../../../components/section-card';
import { EmptyState, ErrorState, LoadingState } from '../../../components/states';
import { TipCategoryBadge, TipStatusBadge } from '../../../components/tip-badges';
import { TipPhoto } from '../../../components/tip-photo';
import { formatCount, formatDateTime } from '../../../lib/format';
import { useSpecies } from '../../../lib/queries/species';
import { useTankChoices } from '../../../lib/queries/tank-choices';
import { useTipReach } from '../api/get-care-tip';
import { tipMoment } from './care-tip-list';

const plural = (count: number, one: string, many: string) =>
  `${formatCount(count)} ${count === 1 ? one : many}`;

function AudienceWords({ audience }: { audience: TipAudience }) {
  const species = useSpecies(audience.kind === 'species' ? audience.speciesId : null);
  const tanks = useTankChoices();
  switch (audience.kind) {
    case 'all':
      return <>All the company’s tanks</>;
    case 'style':
      return <>Tanks of the style “{tankStyleLabels[audience.style]}”</>;
    case 'species':
      return <>Tanks keeping {species.data ? species.data.commonName : 'a species'}</>;
    case 'equipment':
      return <>Tanks with a {equipmentKindLabels[audience.equipmentKind].toLowerCase()}</>;
    case 'tanks': {
      const names = audience.tankIds.map(
        (id) => tanks.data?.find((tank) => tank.id === id)?.name ?? 'a tank',
      );
      return <>Chosen tanks: {names.join(', ')}</>;
    }
  }
}

function Reach({ tip }: { tip: CareTip }) {
  const id = useId();
  const reach = useTipReach(tip.id);
  if (reach.isPending) return <LoadingState label="Loading who it reached…" />;
  if (reach.isError)
    return <ErrorState error={reach.error} what="who it reached" onRetry={() => void reach.refetch()} />;
  if (reach.data.tanks.length === 0) {
    return <EmptyState title="It has not reached any tank yet" />;
  }
  const helpful = reach.data.owners.filter((owner) => owner.helpful).length;
  return (
    <div className="grid gap-4">
      <p className="font-bold text-ink-900">
        Reached {plural(reach.data.tanks.length, 'tank', 'tanks')} and{' '}
        {plural(reach.data.owners.length, 'owner', 'owners')};{' '}
        {helpful === 0
          ? 'nobody has marked it helpful yet'
          : `${plural(helpful, 'owner', 'owners')} found it helpful`}
        .
      </p>
      <div className="grid gap-4 md:grid-cols-2">
        <div>
          <h3 id={`${id}-tanks`} className="font-bold text-ink-900">
            Tanks
          </h3>
          <ul aria-labelledby={`${id}-tanks`} className="mt-1 divide-y divide-ink-100">
            {reach.data.tanks.map((tank) => (
              <li key={tank.id} className="py-2">
                <span className="text-ink-950">{tank.name}</span>
                <span className="block text-sm text-ink-700">
                  Received <time dateTime={tank.deliveredAt}>{formatDateTime(tank.deliveredAt)}</time>
                </span>
              </li>
            ))}
          </ul>
        </div>
        <div>
          <h3 id={`${id}-owners`} className="font-bold text-ink-900">
            Owners
          </h3>
          {reach.data.owners.length === 0 ? (
            <p className="mt-1 text-ink-700">The tanks it reached have no owners signed up yet.</p>
          ) : (
            <ul aria-labelledby={`${id}-owners`} className="mt-1 divide-y divide-ink-100">
              {reach.data.owners.map((owner) => (
                <li
                  key={`${owner.id}-${owner.tankName}`}
                  className="flex flex-wrap items-center justify-between gap-2 py-2"
                >
                  <span>
                    <span className="text-ink-950">{owner.name}</span>
                    <span className="block text-sm text-ink-700">{owner.tankName}</span>
                  </span>
                  {owner.helpful && (
                    <span className="inline-flex items-center gap-1 text-sm font-bold text-healthy-700">
                      <span aria-hidden="true">✓</span> Found it helpful
                    </span>
                  )}
                </li>
              ))}
            </ul>
          )}
        </div>
      </div>
    </div>
  );
}

/** One tip for staff: where it stands, who it is for, the text as owners read it, and its reach. */
export function TipDetail({ tip, notice }: { tip: CareTip; notice: string | null }) {
  return (
    <div>
      {/* Outside the grid, so the empty live region takes no room. */}
      <div role="status">
        {notice && (
          <p className="mb-4 rounded-card border border-healthy-700/30 bg-healthy-100 p-4 font-bold text-healthy-700">
            {notice}
          </p>
        )}
      </div>
      <div className="grid gap-4">
        <div className="grid items-start gap-4 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
          <SectionCard title="As owners read it">
            <article>
              <div className="flex flex-wrap gap-2">
                <TipCategoryBadge category={tip.category} />
              </div>
              <p className="mt-2 text-lg font-bold text-ink-900">{tip.title}</p>
              {tip.photoId && <TipPhoto photoId={tip.photoId} title={tip.title} className="mt-3" />}
              <Markdown source={tip.body} className="mt-2" />
            </article>
          </SectionCard>
          <SectionCard title="About it">
            <dl className="grid gap-3">
              <div>
                <dt className="text-sm font-bold text-ink-700">Where it stands</dt>
                <dd className="mt-1 flex flex-wrap items-center gap-2 text-ink-950">
                  <TipStatusBadge status={tip.status} /> {tipMoment(tip)}
                </dd>
              </div>
              <div>
                <dt className="text-sm font-bold text-ink-700">Who it is for</dt>
                <dd className="mt-1 text-ink-950">
                  <AudienceWords audience={tip.audience} />
                </dd>
              </div>
              <div>
                <dt className="text-sm font-bold text-ink-700">Suggested to staff</dt>
                <dd className="mt-1 text-ink-950">
                  {tip.suggestWhen.length === 0 ? (
                    'Never: it goes only to its audience.'
                  ) : (
                    <ul className="list-disc pl-5">
                      {tip.suggestWhen.map((trigger) => (
                        <li key={JSON.stringify(trigger)}>
                          {triggerWords(trigger, {
                            group: (group) => `a ${livestockGroupLabels[group].toLowerCase()}`,
                            task: (task) => visitTaskLabels[task],
                          })}
                        </li>
                      ))}
                    </ul>
                  )}
                </dd>
              </div>
              {tip.createdBy && (
                <div>
                  <dt className="text-sm font-bold text-ink-700">Written by</dt>
                  <dd className="mt-1 text-ink-950">{tip.createdBy.name}</dd>
                </div>
              )}
            </dl>
          </SectionCard>
        </div>
        {tip.status !== 'draft' && tip.status !== 'scheduled' && (
          <SectionCard title="Who it reached">
            <Reach tip={tip} />
          </SectionCard>
        )}
      </div>
    </div>
  );
}
