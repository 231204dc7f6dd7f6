/**
 * Renders a vega specification to a standalone SVG string, without a browser.
 *
 * Uses vega's headless view (`renderer: 'none'`) and its SVG string renderer, which escapes
 * the text of every text mark and axis label; the charts rely on that to show user-supplied
 * names as text (checked in tests/io/charts.test.ts). Every chart builder passes its data
 * inline (`values`), never a URL, so rendering reads no file and opens no connection.
 */
import * as vega from 'vega';

export async function renderVegaSvg(spec: vega.Spec): Promise<string> {
  const view = new vega.View(vega.parse(spec), { renderer: 'none' });
  try {
    await view.runAsync();
    const svg = await view.toSVG();
    // Let the chart shrink to the column width on narrow screens and paper.
    return svg.replace('<svg ', '<svg style="max-width:100%;height:auto" ');
  } finally {
    view.finalize();
  }
}
