using System.Diagnostics;

namespace Atlas.Cli.Tests;

public class DeploymentFileTests
{
    private static readonly string Checkout = Storage.AtlasHome.FindCheckout(AppContext.BaseDirectory)!;

    // Debian's docker-compose parses and validates the file without a Docker engine.
    [Fact]
    public void ComposeFileIsValidAndRunsTheApiAndTheWorkerAgainstPostgis()
    {
        var (code, output) = Run("docker-compose", "-f docker-compose.yml config");
        Assert.True(code == 0, output);
        Assert.Contains("postgis/postgis", output);
        Assert.Contains("serve", output);
        Assert.Contains("worker", output);
        Assert.Contains("healthcheck", output);
        Assert.Contains("deploy/Dockerfile", output);
    }

    [Fact]
    public void TheDockerfileRunsAsAnUnprivilegedUser()
    {
        var dockerfile = File.ReadAllText(Path.Combine(Checkout, "deploy", "Dockerfile"));
        Assert.Contains("USER atlas", dockerfile);
        Assert.True(dockerfile.Split("FROM ").Length - 1 >= 2, "multi-stage build expected");
    }

    private static (int Code, string Output) Run(string file, string arguments)
    {
        var start = new ProcessStartInfo(file, arguments) { RedirectStandardOutput = true, RedirectStandardError = true, UseShellExecute = false, WorkingDirectory = Checkout };
        using var process = Process.Start(start)!;
        var stdout = process.StandardOutput.ReadToEndAsync();
        var stderr = process.StandardError.ReadToEnd();
        process.WaitForExit();
        return (process.ExitCode, stdout.Result + stderr);
    }
}
