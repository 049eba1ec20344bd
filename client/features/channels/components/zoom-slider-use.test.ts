import { describe, expect, it } from 'vitest';
import type { EChartsCoreOption } from 'echarts/core';
import { ZOOM_SLIDER_STYLE } from '../../../components/charts/zoom-slider.ts';
import { readingsChartOption } from './readings-chart-option.ts';
import { togetherChartOption, type DrawnLine } from './together-chart-option.ts';
import { planLines } from './together-lines.ts';
import { fenChannel, readings, WEIR } from './together-fixture.ts';

// Invented demo series; only the option's zoom controls are checked here.
const T0 = Date.parse('2026-03-29T00:00:00Z');
const RANGE = { from: T0, to: T0 + 3_600_000 };

const sliders = (o: EChartsCoreOption) => (o.dataZoom as Array<Record<string, unknown>>).filter((z) => z.type === 'slider');

describe('every chart with a zoom slider wears the shared look', () => {
  it('readings chart', () => {
    const option = readingsChartOption(readings([T0, T0 + 60_000], [1, 2]), {
      label: 'Air',
      unit: '°C',
      timezone: 'Europe/Berlin',
      validMin: null,
      validMax: null,
      range: RANGE,
    });
    expect(sliders(option)).toHaveLength(1);
    expect(sliders(option)[0]).toMatchObject(ZOOM_SLIDER_STYLE);
  });

  it('channels together', () => {
    const { lines, axes } = planLines([fenChannel(1, 'Air temperature', '°C', WEIR)]);
    const drawn: DrawnLine[] = lines.map((l) => ({ ...l, series: readings([T0], [1]) }));
    const option = togetherChartOption(drawn, axes, { range: RANGE, zone: 'Europe/Berlin' });
    expect(sliders(option)).toHaveLength(1);
    expect(sliders(option)[0]).toMatchObject(ZOOM_SLIDER_STYLE);
  });
});
