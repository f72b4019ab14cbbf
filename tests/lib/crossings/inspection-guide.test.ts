import { describe, expect, it } from 'vitest';
import { checkGuide, statusesForStyle } from '../../../src/lib/crossings/inspection-statuses';

describe('what the crew checks after a flood, by crossing style', () => {
  it('a continuous floodgate: the breakaway tie, hung droppers, and the strainers and flex runs either side', () => {
    const guide = checkGuide('continuous-floodgate').join(' ');
    expect(guide).toMatch(/breakaway tie/);
    expect(guide).toMatch(/hung droppers/);
    expect(guide).toMatch(/flex runs/);
    expect(statusesForStyle('continuous-floodgate')).toContain('tie-reset');
  });

  it('a drop-down section: the section itself and the end assemblies on both banks, with no flex runs to look along', () => {
    const guide = checkGuide('drop-down-section').join(' ');
    expect(guide).toMatch(/re-hang it, or replace it/);
    expect(guide).toMatch(/end assemblies on both banks/);
    expect(guide).not.toMatch(/flex run|breakaway tie/);
    expect(statusesForStyle('drop-down-section')).toEqual(['intact', 'section-rehung', 'section-lost', 'damaged', 'washed-out']);
  });

  it('every guide carries the floodwater caution', () => {
    for (const style of ['continuous-floodgate', 'drop-down-section', null]) expect(checkGuide(style)).toContain('Never enter floodwater: wait until the channel is safe to walk.');
  });
});
