import { vi } from 'vitest';

/**
 * A stand-in for ECharts' `init` under jsdom (which has no canvas): it records the options it
 * is given and fires `finished` after each, as the real library does after drawing; `emitters`
 * fire other events (e.g. `datazoom`) on each chart made. For component tests only: `vi.mock('…/echarts-setup.ts', () => fakeEchartsModule())`.
 */
export function fakeEchartsModule() {
  const options: unknown[] = [];
  const emitters: Array<(name: string, e: unknown) => void> = [];
  const initChart = vi.fn(() => {
    const handlers = new Map<string, (e: unknown) => void>();
    emitters.push((name, e) => handlers.get(name)?.(e));
    return {
      on: (name: string, fn: (e: unknown) => void) => handlers.set(name, fn),
      setOption: (o: unknown) => {
        options.push(o);
        queueMicrotask(() => handlers.get('finished')?.({}));
      },
      resize: () => undefined,
      dispose: () => undefined,
      getDataURL: () => 'data:image/png;base64,AAAA',
    };
  });
  return { initChart, options, emitters };
}

/** jsdom has no ResizeObserver; charts only need one that observes nothing. */
export function stubResizeObserver() {
  vi.stubGlobal(
    'ResizeObserver',
    class {
      observe() {}
      disconnect() {}
    },
  );
}
