// Redraws several Plotly charts from one message of the server, one after the other in the same task: the browser then
// lays the page out and paints it once for all of them, instead of once between one chart and the next.
import { react } from "../_content/Plotly.Blazor/plotly-interop-7.2.0.js";

export function reactAll(charts) {
  for (const chart of charts) {
    const gd = document.getElementById(chart.id);
    if (window.Plotly && gd && gd._fullLayout) {
      // Plotted already, with its configuration: redrawn without the configuration, which has not changed. Given one,
      // plotly.js rebuilds its context from the defaults and compares it with the old one on every redraw.
      window.Plotly.react(gd, chart.data, chart.layout);
    } else {
      // Not plotted yet (plotly.js still loading): Plotly.Blazor's own function queues the redraw behind the first plot.
      react(chart.id, chart.data, chart.layout, chart.config);
    }
  }
}
