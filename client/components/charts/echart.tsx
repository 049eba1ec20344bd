import { useEffect, useRef, useState, type ReactNode } from 'react';
import type { ECharts, EChartsCoreOption } from 'echarts/core';
import { Button } from '../button.tsx';

/** Where the zoom window now lies, as fractions 0…1 of the x axis. */
export interface ZoomWindow {
  start: number;
  end: number;
}

interface ZoomEvent {
  start?: number;
  end?: number;
  batch?: Array<{ start?: number; end?: number }>;
}

let setup: Promise<typeof import('./echarts-setup.ts')> | null = null;
/** The chart library, fetched once however many charts mount at the same moment. */
const loadSetup = () =>
  (setup ??= import('./echarts-setup.ts').catch((err: unknown) => {
    setup = null; // let the next chart try again
    throw err;
  }));

/**
 * One ECharts chart, loaded on first use (the library is fetched as its own chunk when a
 * chart first mounts). The canvas is hidden from assistive technology; `label` names the
 * figure and `summary` gives its content in words. `data-chart-ready="true"` appears once
 * ECharts has finished drawing (its `finished` event), so tests and screenshots can wait for
 * it. `pngName` adds a "Save as PNG" button (ECharts' `getDataURL`) that downloads the chart.
 */
export function EChart({
  option,
  label,
  summary,
  height = 320,
  pngName,
  onZoom,
}: {
  option: EChartsCoreOption;
  label: string;
  summary: ReactNode;
  height?: number;
  pngName?: string;
  onZoom?: (zoom: ZoomWindow) => void;
}) {
  const box = useRef<HTMLDivElement>(null);
  const [chart, setChart] = useState<ECharts | null>(null);
  const zoomHandler = useRef(onZoom);
  useEffect(() => {
    zoomHandler.current = onZoom;
  }, [onZoom]);
  const [ready, setReady] = useState(false);
  const [failed, setFailed] = useState<string | null>(null);

  useEffect(() => {
    let disposed = false;
    let resize: ResizeObserver | null = null;
    let instance: ECharts | null = null;
    loadSetup()
      .then(({ initChart }) => {
        if (disposed || !box.current) return;
        const c = initChart(box.current, undefined, { renderer: 'canvas' });
        instance = c;
        c.on('finished', () => setReady(true));
        c.on('datazoom', (e) => {
          const z = e as ZoomEvent;
          const first = z.batch?.[0] ?? z;
          if (first.start !== undefined && first.end !== undefined) zoomHandler.current?.({ start: first.start / 100, end: first.end / 100 });
        });
        resize = new ResizeObserver(() => c.resize());
        resize.observe(box.current);
        setChart(c);
      })
      .catch((err: unknown) => setFailed(err instanceof Error ? err.message : String(err)));
    return () => {
      disposed = true;
      resize?.disconnect();
      instance?.dispose();
    };
  }, []);

  useEffect(() => {
    if (!chart) return;
    setReady(false);
    chart.setOption(option, { notMerge: true });
  }, [chart, option]);

  function savePng() {
    if (!chart || !pngName) return;
    const a = document.createElement('a');
    a.href = chart.getDataURL({ type: 'png', pixelRatio: 2, backgroundColor: '#fffdf8' });
    a.download = `${pngName}.png`;
    document.body.append(a);
    a.click();
    a.remove();
  }

  return (
    <figure className="grid gap-2" data-chart-ready={ready ? 'true' : 'false'}>
      <div role="img" aria-label={label} style={{ height }} className="w-full">
        <div ref={box} aria-hidden="true" className="h-full w-full" />
      </div>
      <figcaption className="text-sm text-ink-soft">{failed ? <span className="text-alert">The chart could not be drawn: {failed}</span> : summary}</figcaption>
      {pngName && (
        <div>
          <Button size="sm" tone="quiet" disabled={!ready} onClick={savePng}>
            Save “{label}” as PNG
          </Button>
        </div>
      )}
    </figure>
  );
}
