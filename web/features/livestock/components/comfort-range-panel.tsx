import { formatRange, parameterLabel } from '@shared/livestock/comfort-range';
import type { ParameterKey } from '@shared/parameters/keys';
import type { TankComfortRange } from '../../../lib/queries/comfort-range';

/** The water every present inhabitant tolerates, and where their needs clash. */
export function ComfortRangePanel({ comfort }: { comfort: TankComfortRange }) {
  const names = new Map(comfort.species.map((entry) => [entry.id, entry.commonName]));
  const rows = Object.entries(comfort.ranges) as [
    ParameterKey,
    NonNullable<TankComfortRange['ranges'][ParameterKey]>,
  ][];
  if (rows.length === 0 && comfort.conflicts.length === 0) {
    return <p className="text-sm text-ink-700">The comfort range appears once livestock is recorded.</p>;
  }
  return (
    <div className="space-y-3">
      {comfort.conflicts.map((conflict) => (
        <p
          key={conflict.parameter}
          role="note"
          className="rounded-lg border-l-4 border-watch-700 bg-watch-100 p-3 text-sm"
        >
          {conflict.message}
        </p>
      ))}
      <table className="w-full text-left text-sm">
        <caption className="sr-only">Comfort range for each parameter</caption>
        <thead>
          <tr className="border-b border-ink-100 text-ink-700">
            <th scope="col" className="py-2 pr-3 font-bold">
              Parameter
            </th>
            <th scope="col" className="py-2 pr-3 font-bold">
              Range
            </th>
            <th scope="col" className="py-2 font-bold">
              Set by
            </th>
          </tr>
        </thead>
        <tbody>
          {rows.map(([parameter, band]) => {
            const setters = [...new Set([...band.limitedBy.low, ...band.limitedBy.high])].map(
              (id) => names.get(id) ?? id,
            );
            return (
              <tr key={parameter} className="border-b border-ink-100 last:border-0">
                <th scope="row" className="py-2 pr-3 font-bold text-ink-950">
                  {parameterLabel(parameter).replace(/^./, (c) => c.toUpperCase())}
                </th>
                <td className="whitespace-nowrap py-2 pr-3">{formatRange(parameter, band)}</td>
                <td className="py-2 text-ink-700">
                  {setters.slice(0, 3).join(', ')}
                  {setters.length > 3 ? ' …' : ''}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
