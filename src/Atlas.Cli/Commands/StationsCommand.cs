using System.CommandLine;
using System.Globalization;
using Atlas.Ingest.Assessment;
using Atlas.Storage.Stations;

namespace Atlas.Cli.Commands;

/// <summary><c>atlas stations add|list|remove</c>: the measuring stations whose records validate the hindcasts.</summary>
public static class StationsCommand
{
    public static Command Build() =>
        ReferenceCommands.Group("stations", "Register measuring stations (buoys) with their records, list and remove them.", BuildAdd(), BuildList(),
            ReferenceCommands.Remove("stations", "station", "Remove a station and its record.", "removed with its record",
                (dataSource, name, cancel) => new StationStore(dataSource).DeleteAsync(name, cancel)));

    private static Command BuildAdd()
    {
        var file = new Argument<string>("file")
        {
            Description = "The record: CSV with the header time,hs_m[,tp_s][,te_s][,dir_deg][,qc] (times ISO 8601 UTC), or a CF-NetCDF point time series (featureType timeSeries)",
        };
        var name = new Option<string>("--name") { Description = "The station's name (your own)", Required = true };
        var lat = new Option<double?>("--lat") { Description = "Latitude, degrees north (optional for a NetCDF file that states it)" };
        var lon = new Option<double?>("--lon") { Description = "Longitude, degrees east (optional for a NetCDF file that states it)" };
        var depth = new Option<double?>("--depth") { Description = "Water depth at the mooring, m (optional)" };
        var instrument = new Option<string>("--instrument") { Description = "Kind of instrument, e.g. \"directional wave buoy\"", Required = true };
        var role = new Option<string>("--role") { Description = "calibration (used to tune the hindcast) or validation (kept aside)", Required = true };
        role.AcceptOnlyFromAmong("calibration", "validation");
        var command = new Command("add", "Register a station and load its record; a bad record is reported line by line and nothing is stored.")
        {
            file, name, lat, lon, depth, instrument, role,
        };
        return ReferenceCommands.Add<DuplicateStationException>("stations", command, async (parse, dataSource, cancel) =>
        {
            StationStore.TryParseRole(parse.GetValue(role), out var stationRole);
            var request = new StationLoadRequest(parse.GetValue(name)!, parse.GetValue(lat), parse.GetValue(lon), parse.GetValue(depth),
                parse.GetValue(instrument)!, stationRole, parse.GetValue(file)!);
            return (await new StationLoader(dataSource).LoadAsync(request, cancel)).Describe();
        });
    }

    private static Command BuildList() =>
        ReferenceCommands.List("List the registered stations.", "no stations registered (atlas stations add)",
            (dataSource, cancel) => new StationStore(dataSource).ListAsync(cancel),
            s => string.Create(CultureInfo.InvariantCulture,
                $"{s.Name} [{s.Slug}] {StationStore.RoleName(s.Role)}: {s.Latitude:0.####} N {s.Longitude:0.####} E, depth {(s.DepthMetres is { } d ? $"{d:0.#} m" : "unknown")}, " +
                $"{s.Instrument}; {s.ObservationCount:N0} observations {s.TimeStartUtc:yyyy-MM-dd}..{s.TimeEndUtc:yyyy-MM-dd} ({s.FlaggedCount:N0} flagged) from {s.SourceFile}"));
}
