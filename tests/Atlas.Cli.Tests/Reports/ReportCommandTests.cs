using System.Globalization;
using System.Text.Json;
using Atlas.Cli.Tests.Datasets;
using Atlas.TestSupport;

namespace Atlas.Cli.Tests.Reports;

/// <summary>
/// <c>atlas report</c> run as a user runs it on the demo (two months), read back with poppler-utils (Debian's pdfinfo and
/// pdftotext): the report the API would give, its numbers equal to <c>GET /point</c> of a running <c>atlas serve</c>,
/// and a refused report leaves no file behind.
/// </summary>
public class ReportCommandTests(TwoDatasets data) : IClassFixture<TwoDatasets>
{
    private const string Site = "--lat 50.0 --lon -26.0";

    [Fact]
    public async Task ReportWritesThePdfWhoseNumbersEqualTheServedPointAnswer()
    {
        var folder = Directory.CreateTempSubdirectory("atlas-report-").FullName;
        var path = Path.Combine(folder, "site.pdf");
        var (code, output) = AtlasProcess.Run($"report {TwoDatasets.Demo} {Site} -o \"{path}\"", data.Environment);
        Assert.True(code == 0, output);
        Assert.Contains("written to " + path, output);
        File.Copy(path, Path.Combine(PopplerReport.ArtifactFolder, "cli-site-report.pdf"), overwrite: true);
        var report = new PopplerReport(path);
        Assert.True(report.Pages >= 7, $"{report.Pages} pages");
        Assert.Contains($"Page {report.Pages} of {report.Pages}", PopplerReport.Flatten(report.Page(report.Pages, layout: false)));
        // The demo's buoys lie in the dataset: the nearest one's skill, scatter (with its fitted line) and QQ plot are there.
        var text = report.Flat();
        Assert.Contains("Validation against the nearest measuring station", text);
        Assert.Contains("fitted:", text);
        Assert.Contains("quantile against quantile", text);

        // The served answer for the same position: the report's annual row prints its means.
        var port = RunningAtlas.FreePort();
        var environment = new Dictionary<string, string>(data.Environment) { ["ASPNETCORE_URLS"] = $"http://127.0.0.1:{port}" };
        using var server = new RunningAtlas("serve", environment);
        using var http = new HttpClient();
        string? body = null;
        await Patience.UntilAsync(async () =>
        {
            try { body = await http.GetStringAsync($"http://127.0.0.1:{port}/api/v1/datasets/{TwoDatasets.Demo}/point?lat=50.0&lon=-26.0&period=annual&include=none"); }
            catch (HttpRequestException) { }
            return body is not null;
        }, $"atlas serve to answer\n{server.Output}");
        var annual = JsonDocument.Parse(body!).RootElement.GetProperty("periods")[0];
        var row = report.Page(1).Split('\n').Select(l => l.Trim()).First(l => l.StartsWith("annual ", StringComparison.Ordinal))
            .Split(' ', StringSplitOptions.RemoveEmptyEntries).Where(t => t != "*").ToArray();
        // Columns after the label (and the low-coverage mark of two months): Hs mean, Hs p90, Te mean, Tp mean, J mean;
        // compared at the printed precision.
        Assert.Equal(annual.GetProperty("hs").GetProperty("mean").GetDouble(), Parse(row[1]), 0.005 + 1e-9);
        Assert.Equal(annual.GetProperty("j").GetProperty("mean").GetDouble(), Parse(row[5]), 0.05 + 1e-9);
        Assert.Equal(0, server.Terminate());
    }

    [Theory]
    [InlineData("--device no-such-device", "Unknown device")]
    [InlineData("--from 1990 --to 1991", "No series in the window")]
    public void ARefusedReportSaysWhyAndLeavesNoFile(string options, string reason)
    {
        var folder = Directory.CreateTempSubdirectory("atlas-report-").FullName;
        var path = Path.Combine(folder, "site.pdf");
        var (code, output) = AtlasProcess.Run($"report {TwoDatasets.Demo} {Site} {options} -o \"{path}\"", data.Environment);
        Assert.Equal(2, code);
        Assert.Contains(reason, output);
        Assert.Empty(Directory.GetFiles(folder));
    }

    [Fact]
    public void ABadOptionValueIsNamed()
    {
        var (code, output) = AtlasProcess.Run($"report {TwoDatasets.Demo} --lat 95 --lon -26.0 --hs-max -1", data.Environment);
        Assert.Equal(2, code);
        Assert.Contains("--lat:", output);
        Assert.Contains("--hs-max:", output);
    }

    private static double Parse(string text) => double.Parse(text, NumberStyles.Float, CultureInfo.InvariantCulture);
}
