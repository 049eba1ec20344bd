import type { EChartsCoreOption } from 'echarts/core';

/**
 * Lagbook's colours as `client/styles.css` declares them (`--color-*`): ECharts draws on a
 * canvas and cannot read CSS variables, so they are repeated here; a test checks each against
 * the stylesheet so the two cannot drift apart.
 */
export const PALETTE = {
  paper: '#f5f3ec',
  card: '#fffdf8',
  ink: '#1b2624',
  inkSoft: '#4a5a56',
  rule: '#d9d4c5',
  spruce: '#1f3b36',
  lichen: '#2f6f5e',
  lichenDark: '#245646',
} as const;

/** The slider's grip: a tall six-sided tab with pointed ends, Lagbook's own shape. */
export const ZOOM_HANDLE = 'path://M5,0 L10,5 L10,27 L5,32 L0,27 L0,5 Z';

/** `#rrggbb` with an opacity, as `rgba(…)`. */
const withAlpha = (hex: string, alpha: number) =>
  `rgba(${parseInt(hex.slice(1, 3), 16)}, ${parseInt(hex.slice(3, 5), 16)}, ${parseInt(hex.slice(5, 7), 16)}, ${alpha})`;

/** Everything about how the zoom slider looks, shared by every chart that has one. */
export const ZOOM_SLIDER_STYLE = {
  height: 18,
  backgroundColor: PALETTE.paper,
  borderColor: PALETTE.rule,
  borderRadius: 4,
  fillerColor: withAlpha(PALETTE.lichen, 0.2),
  dataBackground: { lineStyle: { color: PALETTE.inkSoft, width: 0.8, opacity: 0.5 }, areaStyle: { color: PALETTE.rule, opacity: 0.5 } },
  selectedDataBackground: { lineStyle: { color: PALETTE.lichenDark, width: 0.8 }, areaStyle: { color: PALETTE.lichen, opacity: 0.25 } },
  handleIcon: ZOOM_HANDLE,
  handleSize: '150%',
  handleStyle: { color: PALETTE.card, borderColor: PALETTE.lichenDark, borderWidth: 1.5 },
  // no separate grip bar above the slider: the shaded window itself is dragged to pan
  brushSelect: false,
  textStyle: { color: PALETTE.inkSoft, fontSize: 11 },
  emphasis: {
    handleStyle: { color: PALETTE.lichen, borderColor: PALETTE.spruce, borderWidth: 1.5 },
    handleLabel: { show: true },
  },
} as const;

/**
 * The x-axis zoom slider of a time chart in Lagbook's look (ZOOM_SLIDER_STYLE), placed `bottom`
 * pixels above the chart's lower edge, its end labels written by `labelFormatter`. It only
 * moves the view (`filterMode: 'none'`); the page decides what to fetch for the new window.
 */
export function zoomSlider(bottom: number, labelFormatter: (v: number) => string): EChartsCoreOption {
  return { type: 'slider', xAxisIndex: 0, filterMode: 'none', bottom, labelFormatter, ...ZOOM_SLIDER_STYLE };
}
