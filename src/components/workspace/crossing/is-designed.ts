import type { CrossingDesignView, DesignedCrossingView } from '../../../lib/schemas/crossing-view';

/** Whether a stored design has a floodgate layout (rather than a problem, or only extras). */
export const isDesigned = (design: CrossingDesignView | null | undefined): design is DesignedCrossingView => design?.status === 'designed';
