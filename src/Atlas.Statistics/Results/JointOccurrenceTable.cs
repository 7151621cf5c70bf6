namespace Atlas.Statistics.Results;

/// <summary>
/// Joint occurrence of Hm0 and Te over the analysis window (IEC TS 62600-101 bins of 0.5 m by 1 s by default):
/// rows are Hs bins from 0 up to the largest Hs, columns Te bins from the smallest to the largest Te; a bin holds
/// its lower edge and not its upper one. Only steps with both Hs and Te (hence power) count.
/// </summary>
/// <param name="HsBinWidthMetres">Row bin width, m.</param>
/// <param name="TeBinWidthSeconds">Column bin width, s.</param>
/// <param name="HsBinLowerEdges">Lower edge of each row, m.</param>
/// <param name="TeBinLowerEdges">Lower edge of each column, s.</param>
/// <param name="Counts">Steps per bin, [row][column].</param>
/// <param name="FractionOfTime">Counts over the total count.</param>
/// <param name="MeanPowerKilowattsPerMetre">Mean of the per-step power of the steps in the bin; null for an empty bin.</param>
/// <param name="FractionOfEnergy">The bin's share of the summed power (0 everywhere when the power sums to 0).</param>
/// <param name="TotalCount">Steps counted.</param>
public sealed record JointOccurrenceTable(
    double HsBinWidthMetres,
    double TeBinWidthSeconds,
    IReadOnlyList<double> HsBinLowerEdges,
    IReadOnlyList<double> TeBinLowerEdges,
    long[][] Counts,
    double[][] FractionOfTime,
    double?[][] MeanPowerKilowattsPerMetre,
    double[][] FractionOfEnergy,
    long TotalCount);
