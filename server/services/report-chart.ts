/**
 * The report's evidence plot as SVG: the same Orders option the browser draws
 * (shared/plots/orders-option.ts, `forExport`), rendered by echarts' server-side SVG renderer, so
 * the PDF needs no browser.
 */
import * as echarts from 'echarts';
import { ordersOption, type OrdersPlotInput } from '../../shared/plots/orders-option';

/** Size of the evidence plot in the PDF (points: the SVG is drawn 1 px = 1 pt). */
export const EVIDENCE_SIZE = { width: 515, height: 330 } as const;

/** Renders the Orders view of one capture to an SVG string. */
export function evidenceSvg(input: Omit<OrdersPlotInput, 'forExport'>, size: { width: number; height: number } = EVIDENCE_SIZE): string {
  const chart = echarts.init(null, null, { renderer: 'svg', ssr: true, width: size.width, height: size.height });
  try {
    chart.setOption(ordersOption({ ...input, forExport: true }));
    return chart.renderToSVGString();
  } finally {
    // Disposing stops zrender's animation loop; without it the process would not exit.
    chart.dispose();
  }
}
