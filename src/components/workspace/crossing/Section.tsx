import type { ReactNode } from 'react';

/** One titled part of the crossing detail, ruled off from the one above. */
export function Section({ title, children }: { title: string; children: ReactNode }) {
  return (
    <section className="mt-5 border-t border-sand-200 pt-3">
      <h3 className="font-bold text-bark-900">{title}</h3>
      {children}
    </section>
  );
}
