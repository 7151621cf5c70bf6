namespace Atlas.Statistics.Results;

/// <summary>
/// The fraction of valid steps above each threshold, at thresholds 0, step, 2 step, ... up to the first one at or
/// above the largest value (where the fraction is 0). Empty when no step is valid.
/// </summary>
/// <param name="Parameter">The parameter (hs or j).</param>
/// <param name="Step">Spacing of the thresholds, in the parameter's unit.</param>
/// <param name="Thresholds">The thresholds.</param>
/// <param name="Fractions">Fraction of valid steps strictly above each threshold (compared in single precision, like the data).</param>
/// <param name="Count">Valid steps.</param>
public sealed record ExceedanceCurve(WaveParameter Parameter, double Step, IReadOnlyList<double> Thresholds,
    [property: System.Text.Json.Serialization.JsonConverter(typeof(DataPrecisionListJsonConverter))] IReadOnlyList<double> Fractions, long Count);
