import { Section } from './Section';

/** The usual cautions (DESIGN.md, Safety), shown when a stored design carries none. */
const STANDARD_CAUTIONS = [
  'Never enter floodwater, to inspect, clear or re-tie a crossing: wait until the water has gone down.',
  'Locate buried services (pipes, cables) before digging or drilling post holes.',
  'Wear eye and hand protection when straining wire, welding or grinding; strained wire that breaks can whip.',
  'Local codes, permits for works in watercourses, and licensed practice take precedence over this tool.',
];

/** The design's warnings, one to a line; nothing when there are none. */
export function DesignWarnings({ warnings }: { warnings: readonly string[] }) {
  if (warnings.length === 0) return null;
  return (
    <Section title="Warnings">
      <ul className="mt-2 flex flex-col gap-2 text-sm">
        {warnings.map((warning, index) => (
          <li key={index} className="rounded-lg border-l-4 border-ochre-600 bg-sand-100 px-3 py-2">
            {warning}
          </li>
        ))}
      </ul>
    </Section>
  );
}

/** The safety cautions that close every crossing: the design's own, or the standard ones. */
export function SafetyCautions({ cautions }: { cautions: readonly string[] | undefined }) {
  const shown = cautions?.length ? cautions : STANDARD_CAUTIONS;
  return (
    <aside className="mt-5 rounded-lg border-2 border-ochre-600 bg-sand-100 p-3 text-sm text-bark-900" aria-label="Safety cautions">
      <p className="font-bold">Safety</p>
      <ul className="mt-1 list-disc space-y-1 pl-5">
        {shown.map((caution) => (
          <li key={caution}>{caution}</li>
        ))}
      </ul>
    </aside>
  );
}
