// Redraws several Plotly charts from one message of the server, one after the other in the same task: the browser then
// lays the page out and paints it once for all of them, instead of once between one chart and the next. Each chart is
// redrawn by Plotly.Blazor's own interop function (the same module instance the charts use, so the same readiness).
import { react } from "../_content/Plotly.Blazor/plotly-interop-7.2.0.js";

export function reactAll(charts) {
  for (const chart of charts) {
    react(chart.id, chart.data, chart.layout, chart.config);
  }
}
