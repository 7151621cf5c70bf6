using System.Collections.Concurrent;
using System.Diagnostics;
using System.Net;
using System.Net.Sockets;
using Atlas.TestSupport;

namespace Atlas.Cli.Tests;

/// <summary>
/// A long-running <c>atlas</c> process (worker, server) started by a test, with its output kept. Disposing it stops
/// it with SIGTERM and, failing that within <see cref="Patience.Limit"/>, kills it.
/// </summary>
public sealed class RunningAtlas : IDisposable
{
    private readonly Process _process;
    private readonly ConcurrentQueue<string> _lines = new();

    public RunningAtlas(string arguments, IDictionary<string, string> environment)
    {
        var start = new ProcessStartInfo("dotnet", $"\"{Path.Combine(AppContext.BaseDirectory, "atlas.dll")}\" {arguments}")
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
        };
        foreach (var (key, value) in environment) start.Environment[key] = value;
        _process = Process.Start(start)!;
        _process.OutputDataReceived += (_, e) => { if (e.Data is not null) _lines.Enqueue(e.Data); };
        _process.ErrorDataReceived += (_, e) => { if (e.Data is not null) _lines.Enqueue(e.Data); };
        _process.BeginOutputReadLine();
        _process.BeginErrorReadLine();
    }

    public int Id => _process.Id;
    public bool HasExited => _process.HasExited;
    public string Output => string.Join('\n', _lines);
    public IReadOnlyCollection<string> Lines => _lines;

    /// <summary>SIGKILL: the process gets no chance to clean up, as when a machine loses power.</summary>
    public void Kill()
    {
        _process.Kill();
        _process.WaitForExit();
    }

    /// <summary>SIGTERM, as systemd and docker stop a service; returns the exit code.</summary>
    public int Terminate()
    {
        if (_process.HasExited) return _process.ExitCode;
        if (SendSignal(_process.Id, SignalTerminate) != 0) throw new InvalidOperationException($"kill({_process.Id}, SIGTERM) failed");
        if (!_process.WaitForExit(Patience.Limit))
        {
            _process.Kill(entireProcessTree: true);
            throw new TimeoutException($"atlas (pid {_process.Id}) did not stop within {Patience.Limit.TotalMinutes} min of SIGTERM:\n{Output}");
        }
        _process.WaitForExit();
        return _process.ExitCode;
    }

    public void Dispose()
    {
        try { if (!_process.HasExited) Terminate(); }
        catch (TimeoutException) { }
        _process.Dispose();
    }

    private const int SignalTerminate = 15;

    // .NET can handle POSIX signals but not send them; libc's kill(2) sends SIGTERM (Process.Kill sends SIGKILL).
    [System.Runtime.InteropServices.DllImport("libc", EntryPoint = "kill", SetLastError = true)]
    private static extern int SendSignal(int pid, int signal);

    /// <summary>A loopback port that was free a moment ago.</summary>
    public static int FreePort()
    {
        using var listener = new TcpListener(IPAddress.Loopback, 0);
        listener.Start();
        return ((IPEndPoint)listener.LocalEndpoint).Port;
    }
}
