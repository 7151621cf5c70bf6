using System.Runtime.InteropServices;
using System.Text;

namespace Atlas.Cli.Commands;

/// <summary>
/// The runtime settings of <c>atlas serve</c>, which the other commands run without.
/// </summary>
/// <remarks>
/// The runtime reads its settings once, as a process starts, and one set of them (atlas.runtimeconfig.json) serves
/// every command. Most commands are batch processes of a few seconds (an ingest, a statistics pass): they run with
/// the workstation garbage collector and without the runtime's profile-guided recompilation, which in so short a life
/// costs more than it gains (statistics pass: 0.90 of the processor time, 0.95 of the time, peak memory 127 MB
/// instead of 133 MB; ingest 0.94 and 0.97; paired runs, tests/benchmarks/README.md). The web server lives for days and answers requests on every
/// core: it wants both, and the server's CPU per uncached point answer was 15-50 % higher without the profile.
/// So <c>atlas serve</c>, started without them, starts itself again at once with them set (execve: the same process
/// id, arguments, streams and environment, plus the settings). A setting already given in the environment is kept.
/// </remarks>
public static unsafe class ServerRuntimeSettings
{
    /// <summary>Environment variables the runtime reads at start, and the values the server wants.</summary>
    public static readonly IReadOnlyList<(string Name, string Value)> Settings =
    [
        ("DOTNET_gcServer", "1"),
        ("DOTNET_TieredPGO", "1"),
    ];

    /// <summary>
    /// For <c>atlas serve</c> started without the settings: replaces this process with itself, the settings added.
    /// Returns (doing nothing) for other commands, where the settings are already present, or where it cannot.
    /// </summary>
    public static void ApplyTo(string[] args)
    {
        if (args.Length == 0 || args[0] != "serve" || !OperatingSystem.IsLinux()) return;
        var missing = Settings.Where(s => Environment.GetEnvironmentVariable(s.Name) is null).ToArray();
        if (missing.Length == 0) return;
        byte[] commandLine;
        try
        {
            commandLine = File.ReadAllBytes("/proc/self/cmdline");
        }
        catch (IOException)
        {
            return;
        }
        var arguments = SplitNulTerminated(commandLine);
        var environment = Environment.GetEnvironmentVariables().Cast<System.Collections.DictionaryEntry>()
            .Select(e => $"{e.Key}={e.Value}").Concat(missing.Select(s => $"{s.Name}={s.Value}")).ToArray();
        string why;
        try
        {
            // The program by its own path (not /proc/self/exe), so that the process keeps its name for ps and pgrep.
            Execute(Environment.ProcessPath ?? "/proc/self/exe", arguments, environment);
            why = Marshal.GetLastPInvokeErrorMessage();
        }
        catch (Exception e) when (e is DllNotFoundException or EntryPointNotFoundException)
        {
            why = e.Message;
        }
        // Still here: the start failed (it does not on Linux with glibc and /proc). The server runs as it is, and says so.
        Console.Error.WriteLine($"atlas serve: running without {string.Join(", ", missing.Select(s => s.Name + "=" + s.Value))} " +
                                $"(could not restart with them: {why})");
    }

    private static string[] SplitNulTerminated(byte[] bytes)
    {
        var text = Encoding.UTF8.GetString(bytes);
        return text.TrimEnd('\0').Split('\0');
    }

    private static void Execute(string path, string[] arguments, string[] environment)
    {
        var pinned = new List<GCHandle>();
        try
        {
            var argv = Terminated(arguments, pinned);
            var envp = Terminated(environment, pinned);
            fixed (IntPtr* a = argv)
            fixed (IntPtr* e = envp)
                execve(path, a, e);
        }
        finally
        {
            foreach (var handle in pinned) handle.Free();
        }
    }

    /// <summary>A null-terminated array of pointers to NUL-terminated UTF-8 strings, pinned until the call.</summary>
    private static IntPtr[] Terminated(string[] values, List<GCHandle> pinned)
    {
        var pointers = new IntPtr[values.Length + 1];
        for (var i = 0; i < values.Length; i++)
        {
            var handle = GCHandle.Alloc(Encoding.UTF8.GetBytes(values[i] + "\0"), GCHandleType.Pinned);
            pinned.Add(handle);
            pointers[i] = handle.AddrOfPinnedObject();
        }
        return pointers;
    }

    [DllImport("libc.so.6", SetLastError = true)]
    private static extern int execve([MarshalAs(UnmanagedType.LPUTF8Str)] string path, IntPtr* argv, IntPtr* envp);
}
