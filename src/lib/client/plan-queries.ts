import type { QueryClient } from '@tanstack/react-query';

/** The workspace queries that show the plan: what a saved change, an undo or an import makes stale. */
const PLAN_QUERY_KEYS = ['fence-lines', 'crossings', 'paddocks', 'costs'] as const;

/** Reads the property's plan again (every plan query), resolving once they are refetched. */
export async function refreshPlanQueries(queryClient: QueryClient, propertyId: number): Promise<void> {
  await Promise.all(PLAN_QUERY_KEYS.map((key) => queryClient.invalidateQueries({ queryKey: [key, propertyId] })));
}
