using System.CommandLine;
using System.Globalization;
using Atlas.Ingest.Validation;
using Atlas.Storage;
using Atlas.Storage.Datasets;
using Atlas.Storage.Stations;
using Microsoft.Extensions.DependencyInjection;
using Npgsql;

namespace Atlas.Cli.Commands;

/// <summary>
/// <c>atlas validate SLUG [--station NAME]</c>: compare a dataset with the registered stations, print the skill, and store
/// the summary in the dataset's metadata (member <c>validation</c>), where the catalogue and downloads find it.
/// </summary>
public static class ValidateCommand
{
    public static Command Build()
    {
        var dataset = new Argument<string>("dataset") { Description = "Slug of the dataset" };
        var station = new Option<string?>("--station") { Description = "Validate at this station only (printed, not stored: the stored summary covers every station)" };
        var command = new Command("validate", "Compare a dataset with the measuring stations: bias, RMSE, scatter index, correlation.") { dataset, station };
        command.SetAction(async (parse, cancel) =>
        {
            await using var dataSource = await AtlasDatabase.OpenMigratedAsync(cancel: cancel);
            return await RunAsync(dataSource, parse.GetValue(dataset)!, parse.GetValue(station), cancel);
        });
        return command;
    }

    public static async Task<int> RunAsync(NpgsqlDataSource dataSource, string slug, string? stationName, CancellationToken cancel)
    {
        // The service as the host registers it: the distance limit comes from configuration (appsettings.json,
        // StationValidation__... variables, or the API's AtlasApiOptions__... ones), and a wrong value stops here with its name.
        using var host = CommandHost.BuildChecked(dataSource, "validate");
        if (host is null) return 2;
        var service = host.Services.GetRequiredService<ValidationService>();
        var dataset = await new DatasetStore(dataSource).FindAsync(slug, cancel);
        if (dataset is null)
        {
            Console.Error.WriteLine($"atlas validate: there is no dataset '{slug}'");
            return 2;
        }
        IReadOnlyList<StoredStation> stations;
        if (stationName is not null)
        {
            if (await service.Stations.FindAsync(stationName, cancel) is not { } found)
            {
                Console.Error.WriteLine($"atlas validate: there is no station '{stationName}' (atlas stations list)");
                return 2;
            }
            stations = [found];
        }
        else stations = await service.Stations.ListAsync(cancel);
        if (stations.Count == 0)
        {
            Console.Error.WriteLine("atlas validate: no stations registered (atlas stations add)");
            return 2;
        }

        var started = DateTime.UtcNow;
        var covered = new List<StationSkill>();
        var notCovered = new List<StationNotCovered>();
        foreach (var station in stations)
        {
            var (skills, missing) = await service.AtStationsAsync(dataset, [station], cancel);
            covered.AddRange(skills);
            notCovered.AddRange(missing);
            foreach (var s in skills) Print(s);
            foreach (var m in missing) Console.WriteLine($"{m.Station}: not covered: {m.Reason}");
        }
        var stored = stationName is null;
        if (stored) await new DatasetStore(dataSource).MergeMetadataAsync(dataset.Id, ValidationReporting.MetadataJson(covered, notCovered, DateTime.UtcNow), cancel);
        Console.WriteLine(string.Create(CultureInfo.InvariantCulture,
            $"validate {slug}: {covered.Count} station(s) compared, {notCovered.Count} not covered, in {(DateTime.UtcNow - started).TotalSeconds:0.0} s{(stored ? "; summary stored in the dataset metadata" : " (one station: not stored)")}"));
        return 0;
    }

    private static void Print(StationSkill s)
    {
        var c = CultureInfo.InvariantCulture;
        Console.WriteLine(string.Create(c,
            $"{s.Station.Name} ({s.Station.Role}{(s.Station.Independent ? ", independent" : "")}): cell {s.Cell.Id}, {s.Cell.DistanceM:0} m away, tolerance {s.Matching.ToleranceHours:0.##} h"));
        foreach (var v in s.Variables)
        {
            if (v.Overall is { } o)
                Console.WriteLine(string.Create(c,
                    $"  {v.Variable,-3} N {o.N,6}  mean obs {o.MeanObserved,7:0.###} {v.Unit,-2} mod {o.MeanModelled,7:0.###}  bias {o.Bias,7:+0.000;-0.000;0.000}  " +
                    $"RMSE {o.Rmse,6:0.###}  SI {o.ScatterIndex,6:0.###}  r {o.PearsonR,6:0.###}  slope {o.SymmetricSlope,6:0.###}"));
            else if (v.Directional is { } d)
                Console.WriteLine(string.Create(c,
                    $"  {v.Variable,-3} N {d.N,6}  circular bias {d.CircularBias,7:+0.0;-0.0;0.0} deg  circular RMSE {d.CircularRmse,6:0.#} deg  mean |diff| {d.MeanAbsoluteDifference,6:0.#} deg"));
            Console.WriteLine($"      unmatched: {v.Counts.Flagged} flagged, {v.Counts.ObservedMissing} missing, {v.Counts.OutsideModelRecord} outside the model record, " +
                              $"{v.Counts.ModelGap} in model gaps, {v.Counts.ModelMissing} at missing model values");
        }
        foreach (var note in s.Notes) Console.WriteLine("  note: " + note);
    }
}
