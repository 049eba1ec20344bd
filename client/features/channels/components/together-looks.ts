/** How one line of the channels-together chart looks: colour, dash pattern and point symbol. */
export interface LineLook {
  /** Name of the look in words, for the page's legend read out by screen readers. */
  name: string;
  color: string;
  /** ECharts `lineStyle.type`: 'solid' or a dash pattern in px (drawn, gap, drawn, gap…). */
  dash: 'solid' | number[];
  /** ECharts symbol drawn at the points (when few) and in the legend. */
  symbol: string;
}

/**
 * The six looks, in the order lines get them. Colours come from the palette of
 * `client/styles.css` where a token is dark enough for a thin line on the card (lichen, alert,
 * ink), the amber token darkened until it is, and two of our own (slate blue, heather) in the
 * same muted key; every one has at least 3:1 contrast against the card (WCAG 2.1 SC 1.4.11,
 * checked in the unit test). Colour is never the only cue: each line also has its own dash
 * pattern and point symbol, so the lines stay apart in grey print and for colour-blind readers.
 */
export const TOGETHER_LOOKS: readonly LineLook[] = [
  { name: 'green, solid, circles', color: '#2f6f5e', dash: 'solid', symbol: 'circle' },
  { name: 'red-brown, long dashes, squares', color: '#b23a2a', dash: [10, 4], symbol: 'rect' },
  { name: 'slate blue, dots, triangles', color: '#35608f', dash: [2, 3], symbol: 'triangle' },
  { name: 'dark amber, dash-dot, diamonds', color: '#8f5f0e', dash: [10, 3, 2, 3], symbol: 'diamond' },
  { name: 'heather, short dashes, open circles', color: '#7b3f7a', dash: [5, 4], symbol: 'emptyCircle' },
  { name: 'ink, dash-dot-dot, open triangles', color: '#1b2624', dash: [12, 3, 2, 3, 2, 3], symbol: 'emptyTriangle' },
];
