using System.Diagnostics;
using Npgsql;

namespace Atlas.Storage;

/// <summary>
/// The tool's own PostgreSQL + PostGIS cluster, used when no ATLAS_DB connection string is configured. It lives in
/// <c>{home}/pg</c>, listens on 127.0.0.1 only, on a fixed non-default port, with its socket in <c>{home}/run</c>.
/// When the tool runs as root the cluster is created and run as the <c>postgres</c> system user, since PostgreSQL
/// refuses to run as root.
/// </summary>
public sealed class EmbeddedCluster
{
    public const int DefaultPort = 54329;
    public const string SuperUser = "atlas";
    public const string DatabaseName = "atlas";

    private readonly string _home;

    public EmbeddedCluster(string home, int port = DefaultPort)
    {
        _home = home;
        Port = port;
    }

    public int Port { get; }
    public string DataDirectory => Path.Combine(_home, "pg");
    public string SocketDirectory => Path.Combine(_home, "run");
    public string LogFile => Path.Combine(_home, "pg.log");
    public bool IsCreated => File.Exists(Path.Combine(DataDirectory, "PG_VERSION"));

    public string ConnectionString =>
        $"Host=127.0.0.1;Port={Port};Username={SuperUser};Database={DatabaseName};Pooling=true;Maximum Pool Size=40;Timeout=15;Command Timeout=0";

    public static string BinDirectory
    {
        get
        {
            var configured = Environment.GetEnvironmentVariable("ATLAS_PG_BIN");
            if (!string.IsNullOrWhiteSpace(configured)) return configured;
            foreach (var version in new[] { "15", "16", "17" })
            {
                var dir = $"/usr/lib/postgresql/{version}/bin";
                if (File.Exists(Path.Combine(dir, "pg_ctl"))) return dir;
            }
            throw new InvalidOperationException(
                "PostgreSQL server binaries were not found under /usr/lib/postgresql/*/bin. Install them (apt-get install postgresql-15 postgresql-15-postgis-3) or set ATLAS_PG_BIN, or point ATLAS_DB at a server.");
        }
    }

    private static bool RunningAsRoot => OperatingSystem.IsLinux() && Environment.UserName == "root";

    /// <summary>Creates the cluster if it does not exist, starts it if it is not running, and creates the database.</summary>
    public async Task EnsureRunningAsync(CancellationToken cancel = default)
    {
        if (IsCreated && await AnswersAsync(cancel)) return;
        if (!IsCreated) Create();
        if (!IsRunning()) Start();
        await WaitUntilAcceptingAsync(cancel);
        EnsureDatabase();
    }

    /// <summary>
    /// Whether this cluster already runs and holds its database: one connection and one question, instead of pg_ctl,
    /// pg_isready and psql (three processes, 0.3 s before every command's own work). The cluster that answers must be
    /// this one, by its data directory: another on the same port (another checkout's) is not taken for it.
    /// </summary>
    private async Task<bool> AnswersAsync(CancellationToken cancel)
    {
        var settings = new NpgsqlConnectionStringBuilder(ConnectionString) { Pooling = false, Timeout = 3 };
        try
        {
            await using var connection = new NpgsqlConnection(settings.ConnectionString);
            await connection.OpenAsync(cancel);
            await using var command = new NpgsqlCommand("SHOW data_directory", connection);
            return await command.ExecuteScalarAsync(cancel) is string directory &&
                   Path.GetFullPath(directory).TrimEnd('/') == Path.GetFullPath(DataDirectory).TrimEnd('/');
        }
        catch (NpgsqlException)
        {
            return false;  // not running, not accepting yet, or no database: the full way below says which
        }
    }

    public void Create()
    {
        Directory.CreateDirectory(_home);
        Directory.CreateDirectory(DataDirectory);
        Directory.CreateDirectory(SocketDirectory);
        HandToServiceUser(DataDirectory);
        HandToServiceUser(SocketDirectory);
        var output = RunServerTool("initdb",
            $"-D \"{DataDirectory}\" -U {SuperUser} --auth=trust --encoding=UTF8 --locale=C.UTF-8", 180);
        if (!IsCreated) throw new InvalidOperationException($"initdb did not create a cluster in {DataDirectory}:\n{output}");
        File.AppendAllText(Path.Combine(DataDirectory, "postgresql.conf"), string.Join('\n',
            "",
            "# written by atlas: loopback only, sized for a workstation",
            "listen_addresses = '127.0.0.1'",
            $"port = {Port}",
            $"unix_socket_directories = '{SocketDirectory}'",
            "max_connections = 100",
            "shared_buffers = 512MB",
            "work_mem = 32MB",
            "maintenance_work_mem = 256MB",
            "max_wal_size = 4GB",
            "synchronous_commit = off",
            "default_toast_compression = 'lz4'",
            // PostgreSQL 15's defaults, stated: enough WAL for a streaming standby (CreateStandby; pg_hba.conf of
            // initdb --auth=trust already lets loopback connect for replication).
            "wal_level = replica",
            "max_wal_senders = 10",
            ""));
    }

    /// <summary>
    /// Creates a streaming standby of this running cluster in <paramref name="home"/> on <paramref name="port"/>
    /// (loopback): a base backup taken with <c>pg_basebackup -R</c>, which also writes the standby's connection to
    /// this cluster, so that once started it replays this cluster's WAL and answers read-only queries. Start it with
    /// <see cref="EnsureRunningAsync"/>.
    /// </summary>
    public EmbeddedCluster CreateStandby(string home, int port)
    {
        var standby = new EmbeddedCluster(home, port);
        if (standby.IsCreated) throw new InvalidOperationException($"A cluster already exists in {standby.DataDirectory}.");
        Directory.CreateDirectory(home);
        Directory.CreateDirectory(standby.SocketDirectory);
        HandToServiceUser(home);
        RunServerTool("pg_basebackup",
            $"-h 127.0.0.1 -p {Port} -U {SuperUser} -D \"{standby.DataDirectory}\" -R -X stream -c fast", 600);
        File.AppendAllText(Path.Combine(standby.DataDirectory, "postgresql.conf"), string.Join('\n',
            "",
            "# written by atlas: a streaming standby on a port of its own",
            $"port = {port}",
            $"unix_socket_directories = '{standby.SocketDirectory}'",
            ""));
        HandToServiceUser(standby.DataDirectory);
        return standby;
    }

    public bool IsRunning()
    {
        if (!IsCreated) return false;
        var (code, _) = RunServerToolWithCode("pg_ctl", $"-D \"{DataDirectory}\" status", 30);
        return code == 0;
    }

    public void Start()
    {
        if (File.Exists(LogFile)) HandToServiceUser(LogFile);
        else { File.WriteAllText(LogFile, ""); HandToServiceUser(LogFile); }
        var (code, output) = RunServerToolWithCode("pg_ctl", $"-D \"{DataDirectory}\" -l \"{LogFile}\" -w -t 60 start", 90);
        if (code != 0)
            throw new InvalidOperationException($"The embedded PostgreSQL did not start (pg_ctl exit {code}). {output.Trim()}\nSee {LogFile}.");
    }

    public void Stop()
    {
        if (!IsRunning()) return;
        var (code, output) = RunServerToolWithCode("pg_ctl", $"-D \"{DataDirectory}\" -m fast -w -t 60 stop", 90);
        if (code != 0) throw new InvalidOperationException($"pg_ctl stop failed (exit {code}): {output.Trim()}");
    }

    public string Describe() =>
        !IsCreated ? $"embedded cluster: not created (would live in {DataDirectory}, port {Port})"
        : IsRunning() ? $"embedded cluster: running in {DataDirectory} on 127.0.0.1:{Port}"
        : $"embedded cluster: stopped ({DataDirectory}, port {Port})";

    private async Task WaitUntilAcceptingAsync(CancellationToken cancel)
    {
        var deadline = DateTime.UtcNow.AddSeconds(60);
        while (true)
        {
            var (code, _) = RunServerToolWithCode("pg_isready", $"-h 127.0.0.1 -p {Port}", 10);
            if (code == 0) return;
            if (DateTime.UtcNow > deadline) throw new TimeoutException($"The embedded PostgreSQL on port {Port} did not accept connections within 60 s; see {LogFile}.");
            await Task.Delay(200, cancel);
        }
    }

    private void EnsureDatabase()
    {
        var (_, exists) = RunServerToolWithCode("psql",
            $"-h 127.0.0.1 -p {Port} -U {SuperUser} -d postgres -tAc \"SELECT 1 FROM pg_database WHERE datname = '{DatabaseName}'\"", 30);
        if (exists.Trim() == "1") return;
        var (code, output) = RunServerToolWithCode("createdb", $"-h 127.0.0.1 -p {Port} -U {SuperUser} {DatabaseName}", 60);
        if (code != 0) throw new InvalidOperationException($"createdb failed: {output.Trim()}");
    }

    private static void HandToServiceUser(string path)
    {
        if (!OperatingSystem.IsLinux() || !RunningAsRoot) return;
        Run("chown", $"-R postgres:postgres \"{path}\"", 60);
        // The postgres user must be able to reach the folder through its parents.
        for (var dir = Directory.GetParent(path); dir is not null; dir = dir.Parent)
        {
            var mode = File.GetUnixFileMode(dir.FullName);
            if (!mode.HasFlag(UnixFileMode.OtherExecute))
                File.SetUnixFileMode(dir.FullName, mode | UnixFileMode.OtherExecute);
        }
    }

    private static string RunServerTool(string tool, string arguments, int timeoutSeconds)
    {
        var (code, output) = RunServerToolWithCode(tool, arguments, timeoutSeconds);
        if (code != 0) throw new InvalidOperationException($"{tool} failed (exit {code}): {output.Trim()}");
        return output;
    }

    private static (int Code, string Output) RunServerToolWithCode(string tool, string arguments, int timeoutSeconds)
    {
        var path = Path.Combine(BinDirectory, tool);
        return RunningAsRoot
            ? RunWithCode("runuser", $"-u postgres -- \"{path}\" {arguments}", timeoutSeconds)
            : RunWithCode(path, arguments, timeoutSeconds);
    }

    private static void Run(string file, string arguments, int timeoutSeconds)
    {
        var (code, output) = RunWithCode(file, arguments, timeoutSeconds);
        if (code != 0) throw new InvalidOperationException($"{file} {arguments} failed (exit {code}): {output.Trim()}");
    }

    private static (int Code, string Output) RunWithCode(string file, string arguments, int timeoutSeconds)
    {
        var start = new ProcessStartInfo(file, arguments)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            UseShellExecute = false,
            WorkingDirectory = "/tmp",
        };
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"Could not start {file}.");
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        if (!process.WaitForExit(timeoutSeconds * 1000))
        {
            process.Kill(entireProcessTree: true);
            throw new TimeoutException($"{file} {arguments} did not finish within {timeoutSeconds} s.");
        }
        return (process.ExitCode, stdout.Result + stderr.Result);
    }
}
