using System.CommandLine;
using System.Globalization;
using Atlas.Api.Reports;
using Atlas.Api.Requests;
using Atlas.Storage;
using Microsoft.Extensions.DependencyInjection;
using Npgsql;

namespace Atlas.Cli.Commands;

/// <summary>
/// <c>atlas report SLUG --lat --lon [--from --to --months --device --hs-max --hours] [-o FILE]</c>: the site report of
/// the API's <c>GET /point/report.pdf</c>, built by the same service without HTTP. The file is written to a temporary
/// name beside the target and moved into place only when whole, so a failed report leaves no half-written file.
/// </summary>
public static class ReportCommand
{
    public static Command Build()
    {
        var dataset = new Argument<string>("dataset") { Description = "Slug of the dataset" };
        var lat = new Option<string>("--lat") { Description = "Latitude of the site, degrees north", Required = true };
        var lon = new Option<string>("--lon") { Description = "Longitude of the site, degrees east", Required = true };
        var from = new Option<string?>("--from") { Description = "First calendar year of the window" };
        var to = new Option<string?>("--to") { Description = "Last calendar year of the window" };
        var months = new Option<string?>("--months") { Description = "Calendar months 1..12, comma separated, restricting the statistics" };
        var device = new Option<string?>("--device") { Description = "A stored device's name or slug: adds its yield" };
        var hsMax = new Option<string?>("--hs-max") { Description = $"Access limit of the weather windows, Hs in metres (default {SiteReportRequest.DefaultHsLimitMetres})" };
        var hours = new Option<string?>("--hours") { Description = $"Length of the weather windows, hours (default {SiteReportRequest.DefaultWindowHours})" };
        var output = new Option<string?>("--output", "-o") { Description = "The PDF to write (default: SLUG_site_report_cell_ID.pdf here)" };
        var command = new Command("report", "Write the site report (PDF) of the wet cell nearest a position.")
            { dataset, lat, lon, from, to, months, device, hsMax, hours, output };
        command.SetAction(async (parse, cancel) =>
        {
            var errors = new QueryErrors();
            var request = new SiteReportQuery(parse.GetValue(months), parse.GetValue(device), parse.GetValue(hsMax), parse.GetValue(hours))
                .Request(parse.GetValue(dataset)!, new PointPosition(parse.GetValue(lat), parse.GetValue(lon), parse.GetValue(from), parse.GetValue(to)), errors);
            if (request is null)
            {
                // The query names of the API are the options' names without their dashes (hs_max is --hs-max).
                foreach (var (name, messages) in errors) Console.Error.WriteLine($"atlas report: --{name.Replace('_', '-')}: {string.Join(" ", messages)}");
                return 2;
            }
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            return await RunAsync(dataSource, request, parse.GetValue(output), cancel);
        });
        return command;
    }

    public static async Task<int> RunAsync(NpgsqlDataSource dataSource, SiteReportRequest request, string? output, CancellationToken cancel)
    {
        using var host = CommandHost.BuildChecked(dataSource, "report", services => services.AddAtlasPointServices());
        if (host is null) return 2;
        var started = DateTime.UtcNow;
        var (content, problem) = await host.Services.GetRequiredService<SiteReportService>().GatherAsync(request, cancel);
        if (content is null)
        {
            var details = problem!.ProblemDetails;
            Console.Error.WriteLine($"atlas report: {details.Title}: {details.Detail}");
            return 2;
        }
        var pdf = SiteReportService.Write(content);
        var path = Path.GetFullPath(output ?? $"{request.Slug}_site_report_cell_{content.Statistics.Cell.Id}.pdf");
        var temporary = Path.Combine(Path.GetDirectoryName(path)!, $".{Path.GetFileName(path)}.{Environment.ProcessId}.partial");
        try
        {
            await File.WriteAllBytesAsync(temporary, pdf, cancel);
            File.Move(temporary, path, overwrite: true);
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or OperationCanceledException)
        {
            File.Delete(temporary);
            Console.Error.WriteLine($"atlas report: {path} not written: {e.Message}");
            return 1;
        }
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"report {request.Slug}: cell {content.Statistics.Cell.Id}, {pdf.Length / 1024.0:0} KiB written to {path} in {(DateTime.UtcNow - started).TotalSeconds:0.0} s"));
        return 0;
    }
}
