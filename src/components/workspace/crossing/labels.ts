import type { AngleClass, CrossingStyle, DesignStatus } from '../../../lib/schemas/crossing-view';

export const ANGLE_CLASS_LABEL: Record<AngleClass, string> = { good: 'Good', fair: 'Fair', poor: 'Poor' };

export const DESIGN_STATUS_LABEL: Record<DesignStatus, string> = {
  designed: 'Designed',
  'needs-input': 'Needs a flood mark',
  'no-channel': 'No defined channel',
  failed: 'Could not be designed',
  touch: 'Only touches a drainage line',
  'runs-along': 'Runs along a drainage line',
  'no-terrain': 'No terrain under it yet',
};

export const STYLE_LABEL: Record<CrossingStyle, string> = {
  'continuous-floodgate': 'Continuous floodgate',
  'drop-down-section': 'Drop-down section',
};
