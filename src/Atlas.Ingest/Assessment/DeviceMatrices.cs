using Atlas.Assessment.Yield;
using Atlas.Storage.Devices;

namespace Atlas.Ingest.Assessment;

/// <summary>Converts between stored power matrices and the yield library's <see cref="PowerMatrix"/>: the one place either way.</summary>
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
