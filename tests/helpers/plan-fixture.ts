// A small invented plan for the export and import tests: two fence lines (one with a name full of
// markup), a paddock with a hole given in the wrong winding, a designed crossing with its layout
// points, and a touch with no design. Positions near the demo property (invented).
import type { PlanForExport } from '../../src/lib/geo/plan-data';
import { wireSpecSchema } from '../../src/lib/schemas/plan';

export const TRICKY_NAME = 'North <fence> & "gate" <script>alert(1)</script>';

export function samplePlan(): PlanForExport {
  return {
    propertyName: 'Saltbush & <Rise>',
    exportedAt: '2026-03-01T09:30:00.000Z',
    fenceLines: [
      {
        id: 11,
        name: TRICKY_NAME,
        status: 'approved',
        coordinates: [[141.6401234567891, -31.4401234567891], [141.6452, -31.4409], [141.6503, -31.4412]],
        lengthM: 960.123,
        wireSpec: wireSpecSchema.parse({ wireHeightsM: [0.25, 0.5, 0.75, 1.0], wireKinds: ['plain', 'plain', 'barbed', 'barbed'], postSpacingM: 8 }),
        version: 3,
      },
      {
        id: 14,
        name: 'East paddock fence',
        status: 'planned',
        coordinates: [[141.652, -31.432], [141.6525, -31.4505]],
        lengthM: 2051.2,
        wireSpec: wireSpecSchema.parse({}),
        version: 1,
      },
    ],
    paddocks: [
      {
        id: 5,
        name: 'Creek paddock',
        // Exterior clockwise and hole counter-clockwise: the reverse of RFC 7946 §3.1.6, so the
        // exporters must rewind them.
        rings: [
          [[141.63, -31.43], [141.64, -31.43], [141.64, -31.44], [141.63, -31.44], [141.63, -31.43]],
          [[141.633, -31.433], [141.633, -31.436], [141.636, -31.436], [141.636, -31.433], [141.633, -31.433]],
        ],
        areaHa: 94.87,
      },
    ],
    crossings: [
      {
        id: 201,
        fenceLineId: 11,
        drainageLineId: 7,
        kind: 'crossing',
        position: [141.6455, -31.44092],
        chainageM: 512.4,
        angleDeg: 84.26,
        angleClass: 'good',
        streamOrder: 3,
        catchmentHa: 812.345,
        designStatus: 'designed',
        style: 'continuous-floodgate',
        flood: { levelM: 151.234, maxDepthM: 1.456, widthM: 18.75 },
        layoutPoints: [
          { kind: 'end-strainer', label: 'End strainer (near side)', chainageM: 480.2, position: [141.6452, -31.44085], braced: false, hungDropperLink: null, beyondFence: false, elevationM: 152.6 },
          { kind: 'end-strainer', label: 'End strainer (far side)', chainageM: 545.9, position: [141.6458, -31.44098], braced: false, hungDropperLink: null, beyondFence: false, elevationM: 152.4 },
          { kind: 'flex-run-strainer', label: 'Flex-run strainer (near side)', chainageM: 420.2, position: [141.6446, -31.44075], braced: false, hungDropperLink: null, beyondFence: false, elevationM: null },
          { kind: 'flex-run-strainer', label: 'Flex-run strainer (far side)', chainageM: 605.9, position: [141.6464, -31.4411], braced: false, hungDropperLink: null, beyondFence: false, elevationM: null },
          { kind: 'floodgate-post', label: 'Floodgate post 1', chainageM: 496, position: [141.64535, -31.44088], braced: false, hungDropperLink: 'closed', beyondFence: false, elevationM: 151.1 },
          { kind: 'floodgate-post', label: 'Floodgate post 2, stayed', chainageM: 512, position: [141.6455, -31.44092], braced: true, hungDropperLink: 'open', beyondFence: false, elevationM: 149.8 },
          { kind: 'floodgate-post', label: 'Floodgate post 3', chainageM: 528, position: [141.64565, -31.44095], braced: false, hungDropperLink: 'closed', beyondFence: false, elevationM: 151 },
          { kind: 'breakaway-tie', label: 'Breakaway tie (lowest post)', chainageM: 512, position: [141.6455, -31.44092], braced: false, hungDropperLink: null, beyondFence: false, elevationM: 149.8 },
        ],
      },
      {
        id: 202,
        fenceLineId: 11,
        drainageLineId: 8,
        kind: 'touch',
        position: [141.65, -31.4412],
        chainageM: 955.1,
        angleDeg: null,
        angleClass: null,
        streamOrder: 1,
        catchmentHa: 6.2,
        designStatus: 'touch',
        style: null,
        flood: null,
        layoutPoints: [],
      },
    ],
  };
}
