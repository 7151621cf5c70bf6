using Atlas.Assessment.Yield;
using Atlas.Storage.Devices;

namespace Atlas.Api.Assessment;

/// <summary>Converts between stored power matrices and the yield library's <see cref="PowerMatrix"/>.</summary>
public static class DeviceMatrices
{
    public static PowerMatrix ToPowerMatrix(StoredDeviceMatrix device) =>
        new(device.Name, KindOf(device.AxisKind), device.HsCentresMetres, device.PeriodCentresSeconds, device.PowerKw, device.RatedPowerKw);

    public static WavePeriodKind KindOf(DeviceAxisKind axis) => axis == DeviceAxisKind.Te ? WavePeriodKind.EnergyPeriod : WavePeriodKind.PeakPeriod;

    public static DeviceMatrixDefinition DefinitionOf(PowerMatrix matrix, string slug, string name, string fileName, string sha256)
    {
        var power = new double[matrix.HsCentresMetres.Count, matrix.PeriodCentresSeconds.Count];
        for (var i = 0; i < power.GetLength(0); i++)
            for (var j = 0; j < power.GetLength(1); j++)
                power[i, j] = matrix.PowerAtBinKw(i, j);
        return new DeviceMatrixDefinition(slug, name, matrix.PeriodKind == WavePeriodKind.EnergyPeriod ? DeviceAxisKind.Te : DeviceAxisKind.Tp,
            [.. matrix.HsCentresMetres], [.. matrix.PeriodCentresSeconds], power, matrix.RatedPowerKw, fileName, sha256);
    }
}

/// <summary>A stored device as the API shows it; <c>power_kw</c> rows follow <c>hs_centres_m</c>, columns <c>period_centres_s</c>.</summary>
public sealed record DeviceItem(
    string Name, string Slug, string Axis, double[] HsCentresM, double[] PeriodCentresS, double[][] PowerKw, double RatedPowerKw,
    double[] HsRangeM, double[] PeriodRangeS, string SourceFile, string SourceSha256, DateTime CreatedAtUtc)
{
    public static DeviceItem From(StoredDeviceMatrix d)
    {
        var matrix = DeviceMatrices.ToPowerMatrix(d);
        var rows = Enumerable.Range(0, d.HsCentresMetres.Length)
            .Select(i => Enumerable.Range(0, d.PeriodCentresSeconds.Length).Select(j => d.PowerKw[i, j]).ToArray()).ToArray();
        return new DeviceItem(d.Name, d.Slug, DeviceStore.AxisName(d.AxisKind), d.HsCentresMetres, d.PeriodCentresSeconds, rows, d.RatedPowerKw,
            [matrix.HsLowerEdgeMetres, matrix.HsUpperEdgeMetres], [matrix.PeriodLowerEdgeSeconds, matrix.PeriodUpperEdgeSeconds],
            d.SourceFile, d.SourceSha256, d.CreatedAtUtc);
    }
}

public sealed record DeviceList(IReadOnlyList<DeviceItem> Devices, string Interpolation, string Caution);

public sealed record DeviceRegistered(DeviceItem Device, bool AlreadyRegistered, string Caution);
