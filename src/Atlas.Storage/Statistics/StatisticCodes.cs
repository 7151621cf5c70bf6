namespace Atlas.Storage.Statistics;

/// <summary>
/// The numbers the statistics tables hold for parameters; private to Storage, so that every other project speaks of
/// <see cref="WaveParameter"/> and <see cref="AtlasPeriod"/> (whose stored number is <see cref="AtlasPeriod.Code"/>).
/// A parameter is stored as its declaration index, which must therefore never change.
/// </summary>
internal static class StatisticCodes
{
    public static short Of(WaveParameter parameter) => (short)parameter;

    public static WaveParameter Parameter(short code) =>
        Enum.IsDefined((WaveParameter)code) ? (WaveParameter)code : throw new InvalidDataException($"Stored statistics name parameter code {code}, which this version does not know.");
}
