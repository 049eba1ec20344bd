import type { EChartsCoreOption } from 'echarts/core';

const STEM = '#1f3b36';
const WHITE_NOISE = '#c98d1c';
const BARTLETT = '#2f6f5e';
const STRONG = '#b23a2a';
const SIMULTANEOUS = '#7a4f9a';

/** One correlogram to draw: values at lags, with the bands to draw around zero. */
export interface StemInput {
  name: string;
  lags: number[];
  values: Array<number | null>;
  /** ± half-width of the white-noise band (z/√n), the same at every lag. */
  whiteNoise: number;
  whiteNoiseLabel?: string;
  /** ± half-width of Bartlett's band per lag, aligned with `lags` (null where it does not apply). */
  bartlett?: Array<number | null>;
  /** A lag to pick out (the strongest cross-correlation). */
  highlightLag?: number | null;
  /** A second constant band over all lags together (e.g. a Šidák band for the CCF), drawn solid. */
  simultaneous?: { halfWidth: number; label: string };
  /** How a lag is written on the axis (default: the lag number). */
  lagLabel?: (lag: number) => string;
  xName: string;
}

/**
 * A stem plot of a correlogram (ACF, PACF or CCF): a thin bar per lag with a dot at its value,
 * the white-noise band ±z/√n as dashed lines and, for the ACF, Bartlett's band (the band under
 * the hypothesis that the correlations beyond each lag are zero; Box, Jenkins, Reinsel & Ljung
 * 2015, §2.1.6 — section cited from memory) as a dotted step line; for a CCF, an optional band
 * over all lags together as a solid line. Each band is one legend entry. Animation is off.
 */
export function stemChartOption(input: StemInput): EChartsCoreOption {
  const cats = input.lags.map(input.lagLabel ?? String);
  const flat = (v: number) => input.lags.map(() => v);
  const bandLine = (name: string, data: Array<number | null>, color: string, type: 'dashed' | 'dotted' | 'solid') => ({
    name,
    type: 'line',
    data,
    step: 'middle',
    showSymbol: false,
    silent: true,
    connectNulls: false,
    lineStyle: { color, type, width: 1.2 },
    itemStyle: { color },
  });
  const wnName = input.whiteNoiseLabel ?? 'White-noise band ±z/√n';
  const series: EChartsCoreOption[] = [
    { name: input.name, type: 'bar', data: input.values, barWidth: 2, itemStyle: { color: STEM }, z: 3 },
    {
      name: input.name,
      type: 'scatter',
      data: input.values.map((v, i) => ({ value: v, itemStyle: { color: input.lags[i] === input.highlightLag ? STRONG : STEM } })),
      // heads only where they can be told apart; the highlighted lag always
      symbolSize: (_v: unknown, p: { dataIndex: number }) => (input.lags[p.dataIndex] === input.highlightLag ? 9 : input.lags.length <= 80 ? 5 : 0),
      z: 4,
    },
    bandLine(wnName, flat(input.whiteNoise), WHITE_NOISE, 'dashed'),
    bandLine(wnName, flat(-input.whiteNoise), WHITE_NOISE, 'dashed'),
  ];
  if (input.bartlett) {
    const name = 'Bartlett band (MA null up to the previous lag)';
    series.push(
      bandLine(name, input.bartlett, BARTLETT, 'dotted'),
      bandLine(
        name,
        input.bartlett.map((b) => (b === null ? null : -b)),
        BARTLETT,
        'dotted',
      ),
    );
  }
  if (input.simultaneous) {
    const { halfWidth, label } = input.simultaneous;
    series.push(bandLine(label, flat(halfWidth), SIMULTANEOUS, 'solid'), bandLine(label, flat(-halfWidth), SIMULTANEOUS, 'solid'));
  }
  return {
    animation: false,
    textStyle: { fontFamily: 'Figtree Variable, system-ui, sans-serif', color: '#1b2624' },
    legend: {
      top: 0,
      left: 0,
      data: [
        input.name,
        wnName,
        ...(input.bartlett ? ['Bartlett band (MA null up to the previous lag)'] : []),
        ...(input.simultaneous ? [input.simultaneous.label] : []),
      ],
    },
    grid: { left: 48, right: 16, top: 40, bottom: 44 },
    tooltip: { trigger: 'axis', axisPointer: { type: 'shadow' }, valueFormatter: (v: unknown) => (typeof v === 'number' ? v.toFixed(3) : '—') },
    xAxis: {
      type: 'category',
      data: cats,
      name: input.xName,
      nameLocation: 'middle',
      nameGap: 28,
      axisTick: { alignWithLabel: true },
      axisLabel: { hideOverlap: true },
    },
    yAxis: {
      type: 'value',
      min: (e: { min: number }) => Math.min(-0.2, Math.floor(e.min * 10) / 10),
      max: (e: { max: number }) => Math.max(0.2, Math.ceil(e.max * 10) / 10),
    },
    series,
  };
}

/** Lags whose |value| leaves the band (`band(i)` is the half-width at index i), strongest first. */
export function lagsOutsideBand(lags: number[], values: Array<number | null>, band: (i: number) => number | null): Array<{ lag: number; value: number }> {
  const out: Array<{ lag: number; value: number }> = [];
  values.forEach((v, i) => {
    const b = band(i);
    if (v !== null && b !== null && Math.abs(v) > b) out.push({ lag: lags[i], value: v });
  });
  return out.sort((a, b) => Math.abs(b.value) - Math.abs(a.value));
}

/** A correlogram in words for screen readers: how many lags leave the band, and the strongest few. */
export function stemSummary(name: string, outside: Array<{ lag: number; value: number }>, bandName: string, top = 5): string {
  if (outside.length === 0) return `${name}: no lag leaves the ${bandName}.`;
  const list = outside
    .slice(0, top)
    .map((o) => `lag ${o.lag} (${o.value.toFixed(3)})`)
    .join(', ');
  return `${name}: ${outside.length} lag${outside.length === 1 ? '' : 's'} outside the ${bandName}; strongest ${list}.`;
}
