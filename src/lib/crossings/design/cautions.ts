/**
 * The usual cautions shown with every design (DESIGN.md, Safety).
 */

/** Plain-words cautions that go with every floodgate layout and materials list. */
export const FENCING_CAUTIONS: readonly string[] = Object.freeze([
  'Never enter floodwater, to inspect, clear or re-tie a crossing: wait until the water has gone down.',
  'Locate buried services (pipes, cables) before digging or drilling post holes.',
  'Wear eye and hand protection when straining wire, welding or grinding; strained wire that breaks can whip.',
  'Local codes, permits for works in watercourses, and licensed practice take precedence over this tool.',
]);
