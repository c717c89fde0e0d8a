using System.Collections.Concurrent;
using System.Text;
using System.Text.Json;
using LoopShaper.Core.Design;
using LoopShaper.Tests.Shared;
using Microsoft.Data.Sqlite;

namespace LoopShaper.Library.Tests;

/// <summary>
/// Durability: the app, started as a child process with its library in a temporary file and the automation endpoint
/// switched on, takes a burst of saves from three writers at once and is killed (SIGKILL, whole process tree) while
/// saves are in flight. Every save it acknowledged (an HTTP 200 sent only after the commit) must then be in the file,
/// intact and readable as a design file.
/// </summary>
public sealed class KillTests
{
    private const int Writers = 3;
    private const int AcksBeforeKill = 60;

    private sealed record Ack(long Revision, string Sha256, string Sent, long? BasedOn);

    [Fact]
    public async Task Every_acknowledged_revision_survives_a_kill_during_a_burst_of_saves()
    {
        string folder = Directory.CreateTempSubdirectory("loopshaper-kill-").FullName;
        string path = Path.Combine(folder, "library.db");
        var acks = new ConcurrentBag<Ack>();
        int inFlightAtKill;
        var app = await WebAppProcess.StartAsync("--library", path, "--Library:AutomationEndpoint", "true");
        try
        {
            using var http = new HttpClient { BaseAddress = app.BaseUri, Timeout = TimeSpan.FromSeconds(30) };
            int inFlight = 0;
            using var stop = new CancellationTokenSource();
            var writers = Enumerable.Range(0, Writers).Select(w => Task.Run(async () =>
            {
                long? basedOn = null;
                for (int i = 0; !stop.IsCancellationRequested; i++)
                {
                    string sent = DesignFile.Write(TempLibrary.CoreRail.WithInductance((200 + (100 * w) + i) * 1e-9) with { Name = $"writer {w} save {i}" });
                    string uri = "automation/library/save" + (basedOn is long b ? "?basedOn=" + b : string.Empty);
                    Interlocked.Increment(ref inFlight);
                    try
                    {
                        using var response = await http.PostAsync(uri, new StringContent(sent, Encoding.UTF8, "application/json"), stop.Token);
                        Assert.True(response.IsSuccessStatusCode, $"save {i} of writer {w}: {response.StatusCode} {await response.Content.ReadAsStringAsync()}");
                        using var body = JsonDocument.Parse(await response.Content.ReadAsStringAsync());
                        long revision = body.RootElement.GetProperty("revision").GetInt64();
                        acks.Add(new Ack(revision, body.RootElement.GetProperty("sha256").GetString()!, sent, basedOn));
                        basedOn = revision;
                    }
                    catch (Exception ex) when (ex is HttpRequestException or TaskCanceledException or OperationCanceledException)
                    {
                        // The process was killed under this request: not acknowledged, so not required to be there.
                        return;
                    }
                    finally
                    {
                        Interlocked.Decrement(ref inFlight);
                    }
                }
            })).ToArray();

            var deadline = DateTime.UtcNow.AddSeconds(120);
            while (acks.Count < AcksBeforeKill && DateTime.UtcNow < deadline && !writers.Any(t => t.IsFaulted))
            {
                await Task.Delay(5);
            }

            // Kill at a moment when at least one save is on its way.
            while (Volatile.Read(ref inFlight) == 0 && DateTime.UtcNow < deadline && !writers.Any(t => t.IsFaulted))
            {
                Thread.SpinWait(20);
            }

            inFlightAtKill = Volatile.Read(ref inFlight);
            await app.KillAsync();
            stop.Cancel();
            await Task.WhenAll(writers);
            Assert.True(acks.Count >= AcksBeforeKill, "too few saves were acknowledged before the deadline:\n" + app.Log);
        }
        finally
        {
            await app.DisposeAsync();
        }

        // Saves were in flight when the process died: the kill hit the middle of the burst.
        Assert.True(inFlightAtKill > 0, "no save was in flight at the kill");
        using var library = DesignLibrary.Open(path);
        foreach (var ack in acks)
        {
            var stored = library.Read(ack.Revision);
            Assert.NotNull(stored);
            Assert.Equal(ack.Sent, stored.Content);
            Assert.Equal(ack.Sha256, stored.Info.Sha256);
            Assert.True(stored.IsIntact);
            Assert.Equal(ack.BasedOn, stored.Info.ParentId);
            Assert.True(stored.ReadDesign().Succeeded);
        }

        using (var c = new SqliteConnection("Data Source=" + path))
        {
            c.Open();
            using var q = c.CreateCommand();
            q.CommandText = "PRAGMA integrity_check;";
            Assert.Equal("ok", q.ExecuteScalar());
        }

        library.Dispose();
        SqliteConnection.ClearAllPools();
        Directory.Delete(folder, recursive: true);
    }
}
