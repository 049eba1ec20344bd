import * as echarts from 'echarts/core';
import { BarChart, LineChart, ScatterChart } from 'echarts/charts';
import { DataZoomComponent, GridComponent, LegendComponent, MarkLineComponent, TooltipComponent } from 'echarts/components';
import { CanvasRenderer } from 'echarts/renderers';

// Only the pieces Lagbook's charts use, so the chart chunk stays small. Only `echart.tsx`
// imports this module, and only through a dynamic import(): it never lands in the entry chunk.
echarts.use([BarChart, LineChart, ScatterChart, DataZoomComponent, GridComponent, LegendComponent, MarkLineComponent, TooltipComponent, CanvasRenderer]);

/** ECharts' `init`, with Lagbook's charts and components registered. */
export const initChart = echarts.init;
