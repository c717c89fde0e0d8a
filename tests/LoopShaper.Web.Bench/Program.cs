using System.Globalization;
using LoopShaper.Browser.Tests;
using LoopShaper.Tests.Shared;
using Microsoft.Playwright;

// Browser benchmark (not a test): 50 input changes in the workspace, each timed from the change in the page to both
// charts redrawn (Plotly's plotly_afterplot event on the loop-gain and step charts). Prints p50 and p95.
// Before the timed changes, --warmup changes (20) are made and not counted: the server's JIT compiles its hot paths to
// their optimised tier over the first few dozen calls, as it has in a server that has been in use for a while.
// Usage: dotnet run --project tests/LoopShaper.Web.Bench [-- --changes 50] [-- --warmup 20] [-- --shot out.png]
int changes = 50;
int warmup = 20;
string? shot = null;
for (int i = 0; i < args.Length - 1; i++)
{
    if (args[i] == "--changes")
    {
        changes = int.Parse(args[i + 1], CultureInfo.InvariantCulture);
    }
    else if (args[i] == "--warmup")
    {
        warmup = int.Parse(args[i + 1], CultureInfo.InvariantCulture);
    }
    else if (args[i] == "--shot")
    {
        shot = args[i + 1];
    }
}

await using var app = await WebAppProcess.StartAsync();
await using var chromium = await Chromium.LaunchAsync();
var page = await chromium.Context.NewPageAsync();
var consoleErrors = new List<string>();
page.Console += (_, m) =>
{
    if (m.Type == "error")
    {
        consoleErrors.Add(m.Text);
    }
};
if (Environment.GetEnvironmentVariable("BENCH_WS") == "1")
{
    // Every WebSocket message in and out, with its size and time, for the last changes' message list printed below.
    await page.AddInitScriptAsync(@"(() => {
  window.__ws = [];
  const add = WebSocket.prototype.addEventListener;
  const origSend = WebSocket.prototype.send;
  WebSocket.prototype.send = function (d) { window.__ws.push({ t: performance.now(), dir: 'out', n: d.byteLength ?? d.length }); return origSend.call(this, d); };
  Object.defineProperty(WebSocket.prototype, 'onmessage', { configurable: true, set(f) { this.addEventListener('message', f); }, get() { return null; } });
  WebSocket.prototype.addEventListener = function (type, f, o) {
    if (type === 'message') { const g = f; f = function (e) { window.__ws.push({ t: performance.now(), dir: 'in', n: e.data.byteLength ?? e.data.length }); return g.call(this, e); }; }
    return add.call(this, type, f, o);
  };
})()");
}

if (Environment.GetEnvironmentVariable("BENCH_PLOTLY") is { Length: > 0 } plotlyFile)
{
    // Serve another plotly.js bundle in place of the app's (e.g. the unminified one, for a profile with readable names).
    await page.RouteAsync("**/plotly-basic-*.min.js", route => route.FulfillAsync(new RouteFulfillOptions { Path = plotlyFile, ContentType = "text/javascript" }));
}

await page.GotoAsync(app.BaseUri.ToString());
await page.WaitForSelectorAsync("[data-circuit=ready]");
await page.WaitForSelectorAsync("#bode-chart .main-svg");
await page.WaitForSelectorAsync("#step-chart .main-svg");
if (Environment.GetEnvironmentVariable("BENCH_CSS") is { Length: > 0 } css)
{
    // Extra style rules for the run (to try a layout or containment change before making it).
    await page.AddStyleTagAsync(new PageAddStyleTagOptions { Content = css });
}

if (shot is not null)
{
    await page.WaitForTimeoutAsync(1000);
    await page.ScreenshotAsync(new PageScreenshotOptions { Path = shot });
    int n = 0;
    foreach (var card in await page.QuerySelectorAllAsync(".card"))
    {
        await card.ScreenshotAsync(new ElementHandleScreenshotOptions { Path = Path.ChangeExtension(shot, null) + $"-card{++n}.png" });
    }

    await (await page.QuerySelectorAsync(".inputs"))!.EvaluateAsync("e => e.scrollTop = 900");
    await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.ChangeExtension(shot, null) + "-inputs2.png" });
    await (await page.QuerySelectorAsync(".inputs"))!.EvaluateAsync("e => e.scrollTop = 1800");
    await page.ScreenshotAsync(new PageScreenshotOptions { Path = Path.ChangeExtension(shot, null) + "-inputs3.png" });
    Console.WriteLine("screenshots: " + shot + " and its -card*.png, -inputs*.png");
    return 0;
}

if (args.Contains("--probe"))
{
    // Times Plotly.react on the loop-gain chart's own figure with parts of it left out, to see where the browser's time goes.
    string script = await File.ReadAllTextAsync(args[Array.IndexOf(args, "--probe") + 1]);
    var cdp = await page.Context.NewCDPSessionAsync(page);
    await cdp.SendAsync("Profiler.enable");
    await cdp.SendAsync("Profiler.setSamplingInterval", new Dictionary<string, object> { ["interval"] = 200 });
    await cdp.SendAsync("Profiler.start");
    Console.WriteLine(await page.EvaluateAsync<string>(script));
    var profile = await cdp.SendAsync("Profiler.stop");
    if (profile is System.Text.Json.JsonElement p)
    {
        await File.WriteAllTextAsync(Path.Combine(Path.GetTempPath(), "loopshaper-probe.cpuprofile"), p.GetProperty("profile").GetRawText());
        Console.WriteLine("profile: " + Path.Combine(Path.GetTempPath(), "loopshaper-probe.cpuprofile"));
    }

    return 0;
}

// The demo's compensator is entered by parts; switch to frequencies (same loop) so the zero has its own field.
await page.ClickAsync("[data-use-placement]");
await page.WaitForSelectorAsync("#f-compensator-zero1Hz");
await page.WaitForTimeoutAsync(500);

// Count redraws of each chart in the page itself; also time Plotly.react itself (the browser's share).
await page.EvaluateAsync(@"() => {
  window.__react = [];
  const original = window.Plotly.react;
  window.Plotly.react = function (id, ...rest) {
    const t0 = performance.now();
    const r = original.call(this, id, ...rest);
    Promise.resolve(r).then(() => window.__react.push({ id: typeof id === 'string' ? id : id.id, start: t0, ms: performance.now() - t0 }));
    return r;
  };
  window.__draws = { bode: [], step: [] };
  window.__revisions = [];
  new MutationObserver(() => window.__revisions.push(performance.now())).observe(document.querySelector('.workspace'), { attributes: true, attributeFilter: ['data-revision'] });
  document.getElementById('bode-chart').on('plotly_afterplot', () => window.__draws.bode.push(performance.now()));
  document.getElementById('step-chart').on('plotly_afterplot', () => window.__draws.step.push(performance.now()));
}");

// Alternate the inductance and the first compensator zero between values that keep the design valid.
string[] inductances = ["270 nH", "330 nH", "390 nH", "470 nH"];
string[] zeros = ["3.3k", "3.9k", "4.7k", "5.6k"];
var times = new List<double>();
for (int i = 0; i < warmup; i++)
{
    await Change(i);
}

await page.EvaluateAsync("() => { window.__inputs = []; window.__react = []; window.__revisions = []; }");
ICDPSession? profiler = null;
if (Environment.GetEnvironmentVariable("BENCH_PROFILE") == "1")
{
    // The browser's CPU profile over all the changes, written to the temp folder (look at it with any .cpuprofile viewer).
    profiler = await page.Context.NewCDPSessionAsync(page);
    await profiler.SendAsync("Profiler.enable");
    await profiler.SendAsync("Profiler.start");
}

ICDPSession? tracer = null;
var traceEvents = new List<System.Text.Json.JsonElement>();
var traceDone = new TaskCompletionSource();
if (Environment.GetEnvironmentVariable("BENCH_TRACE") == "1")
{
    // The browser's timeline (style, layout, paint and script per thread) over all the changes, written to the temp
    // folder as a Chrome trace (open it in any trace viewer, e.g. chrome://tracing or Perfetto).
    tracer = await page.Context.NewCDPSessionAsync(page);
    tracer.Event("Tracing.dataCollected").OnEvent += (_, e) =>
    {
        if (e is System.Text.Json.JsonElement d)
        {
            lock (traceEvents)
            {
                traceEvents.AddRange(d.GetProperty("value").EnumerateArray().Select(v => v.Clone()));
            }
        }
    };
    tracer.Event("Tracing.tracingComplete").OnEvent += (_, _) => traceDone.TrySetResult();
    await tracer.SendAsync("Tracing.start", new Dictionary<string, object>
    {
        ["categories"] = Environment.GetEnvironmentVariable("BENCH_TRACE_CATEGORIES") ?? "devtools.timeline,disabled-by-default-devtools.timeline,v8.execute",
        ["transferMode"] = "ReportEvents",
    });
}

for (int i = 0; i < changes; i++)
{
    times.Add(await Change(warmup + i));
}

if (profiler is not null && await profiler.SendAsync("Profiler.stop") is System.Text.Json.JsonElement cpu)
{
    string file = Path.Combine(Path.GetTempPath(), "loopshaper-changes.cpuprofile");
    await File.WriteAllTextAsync(file, cpu.GetProperty("profile").GetRawText());
    Console.WriteLine("browser profile: " + file);
}

if (tracer is not null)
{
    await tracer.SendAsync("Tracing.end");
    await traceDone.Task.WaitAsync(TimeSpan.FromSeconds(60));
    string file = Path.Combine(Path.GetTempPath(), "loopshaper-changes.trace.json");
    lock (traceEvents)
    {
        File.WriteAllText(file, System.Text.Json.JsonSerializer.Serialize(new { traceEvents }));
    }

    Console.WriteLine("browser trace: " + file);
}

var react = await page.EvaluateAsync<System.Text.Json.JsonElement>("() => window.__react");
var byChart = react.EnumerateArray().GroupBy(e => e.GetProperty("id").GetString() ?? "?");
foreach (var g in byChart)
{
    var ms = g.Select(e => e.GetProperty("ms").GetDouble()).OrderBy(v => v).ToList();
    Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"Plotly.react on {g.Key}: median {ms[ms.Count / 2]:F1} ms over {ms.Count} redraws (browser only)"));
}

// Where the time of a change goes: from the input event to the start of the loop-gain chart's Plotly.react (the
// server's analysis, render and the figure's trip over the circuit), the react itself, then the step chart's react.
var split = await page.EvaluateAsync<double[]>(@"() => {
  const med = a => { const s = [...a].sort((x, y) => x - y); return s.length ? s[Math.floor(s.length / 2)] : NaN; };
  const toBode = [], gap = [], toDom = [];
  for (const t0 of window.__inputs) {
    const rv = window.__revisions.find(t => t >= t0);
    if (rv) toDom.push(rv - t0);
    const b = window.__react.find(r => r.id === 'bode-chart' && r.start >= t0);
    const st = window.__react.find(r => r.id === 'step-chart' && r.start >= t0);
    if (b) toBode.push(b.start - t0);
    if (b && st) gap.push(st.start - (b.start + b.ms));
  }
  return [med(toBode), med(gap), med(toDom)];
}");
Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"median from input event to the page's new revision in the DOM: {split[2]:F1} ms; to the loop-gain chart's react: {split[0]:F1} ms; from its end to the step chart's react: {split[1]:F1} ms"));

if (Environment.GetEnvironmentVariable("BENCH_WS") == "1")
{
    // Per change: milliseconds after the input event, direction (> out, < in) and bytes of each message.
    var ws = await page.EvaluateAsync<string>(@"() => {
      const out = [];
      const ins = window.__inputs;
      for (let i = ins.length - 6; i < ins.length; i++) {
        const t0 = ins[i], t1 = i + 1 < ins.length ? ins[i + 1] : t0 + 1000;
        out.push('change ' + i + ' at ' + (performance.timeOrigin + t0).toFixed(1) + ': ' + window.__ws.filter(m => m.t >= t0 && m.t < t1).map(m => `${(m.t - t0).toFixed(0)}${m.dir === 'in' ? '<' : '>'}${m.n}`).join(' '));
      }
      return out.join(' || ');
    }");
    Console.WriteLine(ws);
}

times.Sort();
double P(double q) => times[(int)Math.Ceiling(q * times.Count) - 1];
Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"changes: {times.Count} after {warmup} not counted (inductance and compensator zero alternately), from input event to both charts redrawn"));
Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"p50: {P(0.50):F1} ms"));
Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"p95: {P(0.95):F1} ms"));
Console.WriteLine(string.Create(CultureInfo.InvariantCulture, $"min {times[0]:F1} ms, max {times[^1]:F1} ms"));
if (Environment.GetEnvironmentVariable("BENCH_SHOW_SERVER_LOG") == "1")
{
    Console.WriteLine(app.Log);
}

if (consoleErrors.Count > 0)
{
    Console.WriteLine("console errors: " + string.Join(" | ", consoleErrors));
    return 1;
}

return 0;

async Task<double> Change(int i)
{
    string id = i % 2 == 0 ? "f-plant-powerStage-inductor-inductanceH" : "f-compensator-zero1Hz";
    string value = i % 2 == 0 ? inductances[(i / 2) % inductances.Length] : zeros[(i / 2) % zeros.Length];
    return await page.EvaluateAsync<double>(@"([id, value]) => new Promise((resolve, reject) => {
      const nb = window.__draws.bode.length, ns = window.__draws.step.length;
      const input = document.getElementById(id);
      console.timeStamp('bench change'); // marks the change in a BENCH_TRACE timeline
      const t0 = performance.now();
      (window.__inputs = window.__inputs || []).push(t0);
      input.value = value;
      input.dispatchEvent(new Event('input', { bubbles: true }));
      const started = Date.now();
      (function wait() {
        if (window.__draws.bode.length > nb && window.__draws.step.length > ns) {
          resolve(Math.max(window.__draws.bode[nb], window.__draws.step[ns]) - t0);
        } else if (Date.now() - started > 10000) {
          reject(new Error('charts not redrawn within 10 s'));
        } else {
          requestAnimationFrame(wait);
        }
      })();
    })", new object[] { id, value });
}
