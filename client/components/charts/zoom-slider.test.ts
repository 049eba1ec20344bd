import { readdirSync, readFileSync, statSync } from 'node:fs';
import { join, relative } from 'node:path';
import { describe, expect, it } from 'vitest';
import { PALETTE, ZOOM_SLIDER_STYLE, zoomSlider } from './zoom-slider.ts';

const CLIENT = join(__dirname, '..', '..');

/** Every non-test source file of the client. */
function sources(dir = CLIENT): string[] {
  return readdirSync(dir).flatMap((name) => {
    const path = join(dir, name);
    if (statSync(path).isDirectory()) return sources(path);
    return /\.tsx?$/.test(name) && !/\.test\.tsx?$/.test(name) ? [path] : [];
  });
}

describe('zoom slider look', () => {
  it('uses the colours styles.css declares, so the canvas matches the page', () => {
    const css = readFileSync(join(CLIENT, 'styles.css'), 'utf8');
    const token = (name: string) => new RegExp(`--color-${name}:\\s*(#[0-9a-f]{6})`, 'i').exec(css)?.[1]?.toLowerCase();
    const names: Record<keyof typeof PALETTE, string> = {
      paper: 'paper',
      card: 'card',
      ink: 'ink',
      inkSoft: 'ink-soft',
      rule: 'rule',
      spruce: 'spruce',
      lichen: 'lichen',
      lichenDark: 'lichen-dark',
    };
    for (const [key, css] of Object.entries(names)) expect(PALETTE[key as keyof typeof PALETTE], css).toBe(token(css));
  });

  it('sets every colour the slider draws, none of them the library default, and our own handle', () => {
    const text = JSON.stringify(ZOOM_SLIDER_STYLE);
    const colours = new Set([...text.matchAll(/#[0-9a-f]{6}/gi)].map((m) => m[0].toLowerCase()));
    const ours = new Set<string>(Object.values(PALETTE));
    for (const c of colours) expect(ours.has(c), c).toBe(true);
    // the filler is lichen at 20%, not the stock light blue-violet
    expect(ZOOM_SLIDER_STYLE.fillerColor).toBe('rgba(47, 111, 94, 0.2)');
    for (const key of ['backgroundColor', 'borderColor', 'fillerColor', 'handleIcon', 'handleStyle', 'dataBackground', 'selectedDataBackground', 'textStyle'])
      expect(ZOOM_SLIDER_STYLE, key).toHaveProperty(key);
    expect(ZOOM_SLIDER_STYLE.handleIcon).toMatch(/^path:\/\//);
  });

  it('builds a slider on the x axis that only moves the view', () => {
    const fmt = (v: number) => String(v);
    expect(zoomSlider(12, fmt)).toEqual({ type: 'slider', xAxisIndex: 0, filterMode: 'none', bottom: 12, labelFormatter: fmt, ...ZOOM_SLIDER_STYLE });
  });

  it('is the only place in the client that writes a slider option', () => {
    const own = sources().filter((f) => /type:\s*['"]slider['"]/.test(readFileSync(f, 'utf8')));
    expect(own.map((f) => relative(CLIENT, f))).toEqual([join('components', 'charts', 'zoom-slider.ts')]);
    const zooming = sources().filter((f) => /dataZoom\s*:/.test(readFileSync(f, 'utf8')));
    expect(zooming.length).toBeGreaterThan(0);
    for (const f of zooming) expect(readFileSync(f, 'utf8'), relative(CLIENT, f)).toMatch(/zoomSlider\(/);
  });
});
