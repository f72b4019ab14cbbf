import { queryOptions } from '@tanstack/react-query';
import { api } from '../../../lib/client/api';

/**
 * The query of one crossing's full design. `computedAt` is part of the key, so a crossing designed
 * again (new inputs, new terrain, a moved fence) is fetched again when the list shows the change.
 */
export function crossingDetailQuery(propertyId: number, crossingId: number, computedAt: string | null) {
  return queryOptions({
    queryKey: ['crossing', propertyId, crossingId, computedAt ?? ''] as const,
    queryFn: () => api.getCrossing(propertyId, crossingId).then((answer) => answer.crossing),
  });
}
