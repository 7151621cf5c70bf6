using System.CommandLine;
using System.Globalization;
using Atlas.Ingest.Assessment;
using Atlas.Storage.Devices;

namespace Atlas.Cli.Commands;

/// <summary><c>atlas devices add|list|remove</c>: wave-energy converters' power matrices.</summary>
public static class DevicesCommand
{
    public static Command Build() =>
        ReferenceCommands.Group("devices", "Store device power matrices, list and remove them.", BuildAdd(), BuildList(),
            ReferenceCommands.Remove("devices", "device", "Remove a stored device.", "removed",
                (dataSource, name, cancel) => new DeviceStore(dataSource).DeleteAsync(name, cancel)));

    private static Command BuildAdd()
    {
        var file = new Argument<string>("file")
        {
            Description = "Power matrix CSV: first cell hs_m\\te_s or hs_m\\tp_s, then the period bin centres (s); one row per Hs bin centre (m) with power in kW",
        };
        var name = new Option<string>("--name") { Description = "The device's name (your own)", Required = true };
        var rated = new Option<double?>("--rated-kw") { Description = "Rated power, kW (default: the largest matrix value)" };
        var command = new Command("add", "Store a power matrix; a bad matrix is reported cell by cell and nothing is stored.") { file, name, rated };
        return ReferenceCommands.Add<DuplicateDeviceException>("devices", command, async (parse, dataSource, cancel) =>
            (await new DeviceLoader(dataSource).LoadAsync(parse.GetValue(name)!, parse.GetValue(file)!, parse.GetValue(rated), cancel)).Describe());
    }

    private static Command BuildList() =>
        ReferenceCommands.List("List the stored devices.", "no devices stored (atlas devices add)",
            (dataSource, cancel) => new DeviceStore(dataSource).ListAsync(cancel),
            d => string.Create(CultureInfo.InvariantCulture,
                $"{d.Name} [{d.Slug}]: {d.HsCentresMetres.Length} Hs x {d.PeriodCentresSeconds.Length} {DeviceStore.AxisName(d.AxisKind)} bins, rated {d.RatedPowerKw:0.###} kW, from {d.SourceFile}"));
}
