import { describe, expect, it } from 'vitest';
import { chooseZone, lineName, MAX_AXES, planLines, zoneChoices } from './together-lines.ts';
import { BOARDWALK, fenChannel, WEIR } from './together-fixture.ts';

const air = fenChannel(1, 'Air temperature', '°C', WEIR);
const water = fenChannel(2, 'Water temperature', '°C', BOARDWALK);
const rh = fenChannel(3, 'Relative humidity', '%', WEIR);
const level = fenChannel(4, 'Water level', 'cm', BOARDWALK);
const flow = fenChannel(5, 'Outflow', 'L/s', WEIR);
const count = fenChannel(6, 'Birds on the weir', null, WEIR);

describe('planLines', () => {
  it('gives one value axis per unit, shared by the channels of that unit, first unit on the left', () => {
    const { lines, axes, problems } = planLines([air, rh, water]);
    expect(axes.map((a) => [a.name, a.position, a.offset])).toEqual([
      ['°C', 'left', 0],
      ['%', 'right', 0],
    ]);
    expect(lines.map((l) => [l.channel.id, l.axis])).toEqual([
      [1, 0],
      [3, 1],
      [2, 0],
    ]);
    expect(problems).toEqual([]);
  });

  it('labels each line logger · channel (unit), and a channel without unit without brackets', () => {
    expect(lineName(water)).toBe('Boardwalk box · Water temperature (°C)');
    expect(lineName(count)).toBe('Weir mast · Birds on the weir');
    expect(planLines([count]).axes[0].name).toBe('no unit');
  });

  it('puts a third unit on a second right-hand axis and refuses a fourth, naming the channel', () => {
    const { lines, axes, problems } = planLines([air, rh, level, flow, water]);
    expect(MAX_AXES).toBe(3);
    expect(axes.map((a) => [a.name, a.position, a.offset])).toEqual([
      ['°C', 'left', 0],
      ['%', 'right', 0],
      ['cm', 'right', 64],
    ]);
    expect(lines.map((l) => l.channel.id)).toEqual([1, 3, 4, 2]);
    expect(problems).toEqual([
      'channels: one chart has at most 3 value axes (one per unit: °C, %, cm); not drawn: Weir mast · Outflow (L/s) [5]. Open it on a chart of its own.',
    ]);
  });

  it('gives every drawn line its own look', () => {
    const { lines } = planLines([air, rh, water, count]);
    expect(new Set(lines.map((l) => l.look.color)).size).toBe(4);
  });
});

describe('zones', () => {
  const { lines } = planLines([water, air, rh]);
  it('offers the loggers’ zones, first channel first, then UTC', () => {
    expect(zoneChoices(lines)).toEqual(['America/New_York', 'Europe/Berlin', 'UTC']);
  });
  it('shows the first channel’s zone by default, another offered zone when asked, and says so when asked for one not offered', () => {
    const choices = zoneChoices(lines);
    expect(chooseZone(null, choices)).toEqual({ zone: 'America/New_York', problem: null });
    expect(chooseZone('UTC', choices)).toEqual({ zone: 'UTC', problem: null });
    // the person's clock choice (UTC, or their own zone when offered) is the default; the URL still wins
    expect(chooseZone(null, choices, 'UTC')).toEqual({ zone: 'UTC', problem: null });
    expect(chooseZone(null, [...choices, 'Asia/Tokyo'], 'Asia/Tokyo')).toEqual({ zone: 'Asia/Tokyo', problem: null });
    expect(chooseZone('Europe/Berlin', choices, 'UTC')).toEqual({ zone: 'Europe/Berlin', problem: null });
    expect(chooseZone(null, choices, 'Australia/Perth')).toEqual({ zone: 'America/New_York', problem: null });
    expect(chooseZone('Asia/Tokyo', choices)).toEqual({
      zone: 'America/New_York',
      problem: 'zone: “Asia/Tokyo” is neither a zone of these channels’ loggers nor UTC; showing America/New_York.',
    });
  });
});
