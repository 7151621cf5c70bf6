using System.Diagnostics;

namespace Atlas.TestSupport;

/// <summary>
/// Runs the reference tools the tests check against (GDAL, ncgen and ncdump, CDO, Debian's NumPy) and returns what
/// they printed; a run that must succeed throws with the tool's error output when it does not.
/// </summary>
public static class ExternalTool
{
    /// <summary>Debian's interpreter, which has NumPy, SciPy, netCDF4 and GDAL's bindings; another python3 may be first on PATH.</summary>
    public const string Python = "/usr/bin/python3";

    /// <summary>Standard output of a run that must succeed.</summary>
    public static string Run(string program, params string[] arguments) => Run(program, arguments, (byte[]?)null);

    /// <summary>Standard output of a run that must succeed, given <paramref name="standardInput"/> as its input.</summary>
    public static string Run(string program, IEnumerable<string> arguments, string? standardInput) =>
        Run(program, arguments, standardInput is null ? null : System.Text.Encoding.UTF8.GetBytes(standardInput));

    /// <summary>Standard output of a run that must succeed, given the bytes <paramref name="standardInput"/> as its input.</summary>
    public static string Run(string program, IEnumerable<string> arguments, byte[]? standardInput)
    {
        var (code, stdout, stderr) = Start(program, arguments, standardInput);
        if (code != 0) throw new InvalidOperationException($"{program} {string.Join(' ', arguments)} exited {code}: {stderr}{stdout}");
        return stdout;
    }

    /// <summary>Standard output and error of a run, whatever its exit code (usage texts, refusals).</summary>
    public static string Output(string program, IEnumerable<string> arguments)
    {
        var (_, stdout, stderr) = Start(program, arguments, null);
        return stdout + stderr;
    }

    /// <summary>A path for a file of the test's own in the temporary folder (which deploy/test.sh removes after the run).</summary>
    public static string TempFile(string extension) => Path.Combine(Path.GetTempPath(), $"atlas-test-{Guid.NewGuid():N}{extension}");

    private static (int Code, string Stdout, string Stderr) Start(string program, IEnumerable<string> arguments, byte[]? standardInput)
    {
        var start = new ProcessStartInfo(program)
        {
            RedirectStandardOutput = true,
            RedirectStandardError = true,
            RedirectStandardInput = standardInput is not null,
            UseShellExecute = false,
        };
        foreach (var a in arguments) start.ArgumentList.Add(a);
        // HDF5 locks a file it creates, and a tool started meanwhile by another test of this process inherits the
        // descriptor (native libraries open files without close-on-exec), keeping the lock after the writer closed
        // the file: a reader that tries to lock it then fails with "HDF error". Readers here need no lock.
        start.Environment["HDF5_USE_FILE_LOCKING"] = "FALSE";
        using var process = Process.Start(start) ?? throw new InvalidOperationException($"{program} did not start.");
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEndAsync();
        if (standardInput is not null)
        {
            process.StandardInput.BaseStream.Write(standardInput);
            process.StandardInput.Close();
        }
        if (!process.WaitForExit(Patience.Limit))
        {
            process.Kill(true);
            throw new TimeoutException($"{program} took over {Patience.Limit.TotalMinutes} min.");
        }
        return (process.ExitCode, stdout.Result, stderr.Result);
    }
}
