import { useState } from 'react';

/** Long lists show this many rows first; a big station's 2 000 fences need not all be laid out at once. */
export const FIRST_ROWS = 100;

/** How many of `total` rows to show, and a button that shows them all. */
export function useFirstRows(total: number): { limit: number; more: React.ReactNode } {
  const [all, setAll] = useState(false);
  const limit = all ? total : FIRST_ROWS;
  const more =
    total > FIRST_ROWS && !all ? (
      <button type="button" className="btn-quiet mt-2 w-full" onClick={() => setAll(true)}>
        Show all {total} (first {FIRST_ROWS} shown)
      </button>
    ) : null;
  return { limit, more };
}
