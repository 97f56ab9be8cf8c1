import * as echarts from 'echarts';
import PDFDocument from 'pdfkit';
import SVGtoPDF from 'svg-to-pdfkit';
const c = echarts.init(null, null, { renderer: 'svg', ssr: true, width: 400, height: 200 });
c.setOption({ xAxis: { type: 'value' }, yAxis: {}, series: [{ type: 'line', data: [[1, 2], [2, 3]] }] });
const svg = c.renderToSVGString();
console.log(svg.length, typeof SVGtoPDF, typeof PDFDocument);
