import type { ReactNode } from 'react';

/** A label and its value. */
export type Fact = [string, ReactNode];

/** Label/value pairs in two columns. */
export function Facts({ rows }: { rows: Fact[] }) {
  return (
    <dl className="mt-2 grid grid-cols-[minmax(0,1fr)_auto] gap-x-3 gap-y-1 text-sm">
      {rows.map(([label, value]) => (
        <div key={label} className="contents">
          <dt className="text-bark-700">{label}</dt>
          <dd className="text-right font-semibold tabular-nums text-bark-900">{value}</dd>
        </div>
      ))}
    </dl>
  );
}
