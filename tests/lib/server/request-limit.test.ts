import { describe, expect, it } from 'vitest';
import { expensiveRouteOf, tooManyRequestsMessage } from '../../../src/lib/server/request-limit';

describe('expensive routes', () => {
  it('are the heavy ones, matched by method and path', () => {
    expect(expensiveRouteOf('POST', '/api/properties/4/terrain-runs')).toBe('terrain runs');
    expect(expensiveRouteOf('POST', '/api/properties/4/elevation-models')).toBe('elevation model uploads');
    expect(expensiveRouteOf('POST', '/api/properties/4/crossings/analyse')).toBe('crossing analyses');
    expect(expensiveRouteOf('POST', '/api/properties/4/plan-import')).toBe('plan imports');
    expect(expensiveRouteOf('GET', '/api/properties/4/exports/plan.kml')).toBe('exports');
    expect(expensiveRouteOf('GET', '/api/properties/4/materials.csv')).toBe('exports');
    expect(expensiveRouteOf('POST', '/api/properties/4/crossings/9/realignment')).toBe('realignments');
    expect(expensiveRouteOf('POST', '/api/properties/4/work-orders/3/send')).toBe('work order sends');
  });

  it('leave reads and ordinary edits alone', () => {
    expect(expensiveRouteOf('GET', '/api/properties/4/elevation-models')).toBeUndefined();
    expect(expensiveRouteOf('GET', '/api/properties/4/terrain-runs/2')).toBeUndefined();
    expect(expensiveRouteOf('PATCH', '/api/properties/4/fence-lines/3')).toBeUndefined();
    expect(expensiveRouteOf('GET', '/api/properties/4/crossings')).toBeUndefined();
  });

  it('say how many a minute and how long to wait', () => {
    expect(tooManyRequestsMessage('exports', 30, 12.2)).toBe('Too many requests for exports and other heavy work: each person may make 30 a minute. Wait 13 seconds and try again.');
    expect(tooManyRequestsMessage('exports', 30, 0.4)).toMatch(/Wait 1 second and/);
  });
});
