namespace Atlas.Api.Assessment;

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
