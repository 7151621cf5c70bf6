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
/// instead of 133 MB; ingest 0.94 and 0.97; paired runs, tests/benchmarks/README.md). The web server lives for days
/// and answers requests on every core: it wants both, and the server's CPU per uncached point answer was 15-50 %
/// higher without the profile. So <c>atlas serve</c>, started without them, starts itself again at once with them set
/// (execve: the same process id, arguments, streams and environment, plus the settings), and <c>atlas demo
/// --serve</c>, once the demo is loaded, becomes <c>atlas serve</c> the same way. A setting already given in the
/// environment is kept.
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
        if (args is not ["serve", ..] || Missing().Length == 0) return;
        ReplaceProcess(args, args);
    }

    /// <summary>
    /// For <c>atlas demo --serve</c> once the demo is loaded: replaces this process with <c>atlas serve</c> under the
    /// server's settings (the same id and streams, so Ctrl-C and a supervisor still reach it). Returns only when it
    /// could not, having said so; the caller then serves in this process.
    /// </summary>
    public static void ServeInstead(string[] args) => ReplaceProcess(args, ["serve"]);

    private static (string Name, string Value)[] Missing() =>
        Settings.Where(s => Environment.GetEnvironmentVariable(s.Name) is null).ToArray();

    /// <summary>
    /// Runs this program again in this process with <paramref name="arguments"/> in place of <paramref name="given"/>
    /// (the arguments Main received) and the missing settings added to the environment.
    /// </summary>
    private static void ReplaceProcess(string[] given, string[] arguments)
    {
        var missing = Missing();
        string why;
        try
        {
            if (!OperatingSystem.IsLinux()) throw new PlatformNotSupportedException("only on Linux");
            // What precedes Main's arguments on the command line: the program, and for `dotnet atlas.dll` the assembly.
            var commandLine = SplitNulTerminated(File.ReadAllBytes("/proc/self/cmdline"));
            var program = commandLine[..Math.Max(1, commandLine.Length - given.Length)];
            var environment = Environment.GetEnvironmentVariables().Cast<System.Collections.DictionaryEntry>()
                .Select(e => $"{e.Key}={e.Value}").Concat(missing.Select(s => $"{s.Name}={s.Value}")).ToArray();
            // The program by its own path (not /proc/self/exe), so that the process keeps its name for ps and pgrep.
            Execute(Environment.ProcessPath ?? "/proc/self/exe", [.. program, .. arguments], environment);
            why = Marshal.GetLastPInvokeErrorMessage();
        }
        catch (Exception e) when (e is DllNotFoundException or EntryPointNotFoundException or IOException or PlatformNotSupportedException)
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
