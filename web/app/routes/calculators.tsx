import { AlkalinityCalculator } from '../../features/calculators/components/alkalinity-calculator';
import { AmmoniaCalculator } from '../../features/calculators/components/ammonia-calculator';
import { DosingCalculator } from '../../features/calculators/components/dosing-calculator';
import { SalinityCalculator } from '../../features/calculators/components/salinity-calculator';
import { WaterChangeCalculator } from '../../features/calculators/components/water-change-calculator';

// In page order: on a wide screen the first two fill the left column and the rest the right.
const contents = [
  { id: 'salinity', title: 'Salinity' },
  { id: 'ammonia', title: 'Toxic ammonia' },
  { id: 'alkalinity', title: 'Alkalinity units' },
  { id: 'dosing', title: 'Dosing' },
  { id: 'water-change', title: 'Water change planner' },
];

export function CalculatorsRoute() {
  return (
    <div className="mx-auto max-w-6xl px-4 py-8 md:py-12">
      <title>Water calculators — Brinewatch</title>
      <h1 className="text-3xl font-bold text-ink-900 md:text-display">Water calculators</h1>
      <p className="mt-3 max-w-prose text-lg text-ink-700">
        Work out salinity, toxic ammonia, alkalinity units, doses and water changes. Results update as you
        type, and each one names the published source it comes from.
      </p>
      <p className="mt-2 max-w-prose text-sm text-ink-700">
        Brinewatch’s advice is general: change your water gradually, and ask your service company before a big
        correction.
      </p>
      <nav aria-labelledby="contents-title" className="mt-6">
        <h2 id="contents-title" className="text-sm font-bold uppercase tracking-wider text-ink-700">
          On this page
        </h2>
        <ul className="mt-2 flex flex-wrap gap-2">
          {contents.map((item) => (
            <li key={item.id}>
              <a
                href={`#${item.id}`}
                className="inline-flex min-h-11 items-center rounded-full border-2 border-ink-300 bg-white px-4 font-bold text-ink-900 no-underline hover:border-ink-700"
              >
                {item.title}
              </a>
            </li>
          ))}
        </ul>
      </nav>
      <div className="mt-8 grid items-start gap-6 lg:grid-cols-2">
        <div className="grid gap-6">
          <SalinityCalculator />
          <AmmoniaCalculator />
        </div>
        <div className="grid gap-6">
          <AlkalinityCalculator />
          <DosingCalculator />
          <WaterChangeCalculator />
        </div>
      </div>
    </div>
  );
}
