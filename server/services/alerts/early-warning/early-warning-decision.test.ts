import { describe, expect, it } from 'vitest';
import { decideEarlyWarning, WARNING_HYSTERESIS, type WarningState } from './early-warning-decision.ts';

const base: WarningState = { warningOpen: false, limitAlertOpen: false, newestBeyond: false, chance: 0.5, level: 0.8 };

describe('decideEarlyWarning', () => {
  const table: [string, Partial<WarningState>, ReturnType<typeof decideEarlyWarning>][] = [
    ['opens at the level', { chance: 0.8 }, { kind: 'open' }],
    ['opens above the level', { chance: 0.93 }, { kind: 'open' }],
    ['stays closed below the level', { chance: 0.79 }, { kind: 'none' }],
    ['keeps an open warning above the level (fresh projection)', { warningOpen: true, chance: 0.9 }, { kind: 'update' }],
    ['keeps an open warning inside the hysteresis band', { warningOpen: true, chance: 0.71 }, { kind: 'update' }],
    ['resolves below the level less the hysteresis', { warningOpen: true, chance: 0.69 }, { kind: 'resolve', why: 'fell-back' }],
    ['hands over to an open limit alert', { warningOpen: true, limitAlertOpen: true, chance: 0.99 }, { kind: 'resolve', why: 'crossed' }],
    ['opens none beside an open limit alert', { limitAlertOpen: true, chance: 0.99 }, { kind: 'none' }],
    ['opens none when the newest reading is already beyond (the hold runs)', { newestBeyond: true, chance: 0.99 }, { kind: 'none' }],
    ['keeps an open one while the hold runs', { warningOpen: true, newestBeyond: true, chance: 0.2 }, { kind: 'update' }],
    ['resolves an open one without a projection', { warningOpen: true, chance: null }, { kind: 'resolve', why: 'not-projected' }],
    ['does nothing without a projection and no warning', { chance: null }, { kind: 'none' }],
  ];
  for (const [name, state, expected] of table) it(name, () => expect(decideEarlyWarning({ ...base, ...state })).toEqual(expected));

  it('uses a ten-point band', () => expect(WARNING_HYSTERESIS).toBe(0.1));
});
