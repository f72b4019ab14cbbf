import { describe, expect, it } from 'vitest';
import { collectInputChanges, type InputsFormValues } from '../../../src/components/workspace/crossing/crossing-inputs';

const initial: InputsFormValues = {
  floodMarkM: '', channelN: '0.04', overbankN: '', runoffCoefficient: '', aepPercent: '', freeboardM: '', style: 'continuous-floodgate', debris: '',
};

describe('the crossing inputs form', () => {
  it('sends only what changed: a number sets, a blank clears, a comma is a decimal point', () => {
    const { changes, errors } = collectInputChanges({ ...initial, floodMarkM: '0,8', channelN: '' }, initial);
    expect(errors).toEqual({});
    expect(changes).toEqual({ floodMarkM: 0.8, channelN: null });
  });

  it('sets the expected debris, and a blank goes back to the property’s setting', () => {
    expect(collectInputChanges({ ...initial, debris: 'heavy' }, initial).changes).toEqual({ debris: 'heavy' });
    expect(collectInputChanges({ ...initial, debris: '' }, { ...initial, debris: 'light' }).changes).toEqual({ debris: null });
    expect(collectInputChanges(initial, initial).changes).toEqual({});
  });

  it('names the field that is wrong with the server’s own message, and sends nothing for it', () => {
    const { changes, errors } = collectInputChanges({ ...initial, runoffCoefficient: '1.5', freeboardM: 'lots' }, initial);
    expect(errors.runoffCoefficient).toMatch(/above 1/);
    expect(errors.freeboardM).toMatch(/Enter a number/);
    expect(changes.freeboardM).toBeUndefined();
  });
});
