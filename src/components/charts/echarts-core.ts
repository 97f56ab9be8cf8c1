// The parts of echarts the plots use, registered once. Imported only by the lazily loaded chart
// module, so the first page's JavaScript carries none of echarts.
import { BarChart, LineChart, ScatterChart } from 'echarts/charts';
import {
  DataZoomComponent, GraphicComponent, GridComponent, LegendComponent, MarkAreaComponent, MarkLineComponent, MarkPointComponent,
  TooltipComponent,
} from 'echarts/components';
import * as echarts from 'echarts/core';
import { CanvasRenderer } from 'echarts/renderers';

echarts.use([
  LineChart, BarChart, ScatterChart, GridComponent, TooltipComponent, LegendComponent, DataZoomComponent, MarkLineComponent,
  MarkAreaComponent, MarkPointComponent, GraphicComponent, CanvasRenderer,
]);

export { echarts };
