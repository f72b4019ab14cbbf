import type { ReactNode } from 'react';

/** The reasons behind a figure, folded away until asked for. */
export function Why({ reasons, summary = 'Why', children }: { reasons?: readonly string[]; summary?: string; children?: ReactNode }) {
  if (!children && (!reasons || reasons.length === 0)) return null;
  return (
    <details className="group mt-1 text-sm">
      <summary className="flex min-h-11 cursor-pointer items-center font-semibold text-creek-700">{summary}</summary>
      {reasons && reasons.length > 0 && (
        <ul className="mb-2 list-disc space-y-1 pl-5 text-bark-700">
          {reasons.map((reason, index) => (
            <li key={index}>{reason}</li>
          ))}
        </ul>
      )}
      {children}
    </details>
  );
}
