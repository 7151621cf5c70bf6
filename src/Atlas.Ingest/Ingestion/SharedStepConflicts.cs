using Atlas.Storage.Series;

namespace Atlas.Ingest.Ingestion;

/// <summary>
/// Values that differ at a time step given twice (compared as stored: to the storage step, 1 mm for Hs, 0.01 s for
/// periods, 0.01 degree for direction and spread). Collected over the whole load so that the refusal names the largest
/// difference, not merely the first one met.
/// </summary>
public sealed class SharedStepConflicts
{
    private int _count;
    private double _largest = -1;
    private (string File, string Holder, long Time, WaveParameter Variable, int Cell, double Old, double New) _worst;

    public bool Any => _count > 0;

    /// <summary>
    /// Records that <paramref name="file"/> gives <paramref name="fresh"/> where <paramref name="holder"/> gave
    /// <paramref name="old"/> (quantised values; <see cref="SeriesCodec.Missing"/> for a missing value). A value against a
    /// missing one counts as the largest kind of difference.
    /// </summary>
    public void Record(string file, string holder, long time, WaveParameter variable, ushort old, ushort fresh, int cell)
    {
        _count++;
        var step = SeriesCodec.StepOf(variable);
        double a = old == SeriesCodec.Missing ? double.NaN : old * step, b = fresh == SeriesCodec.Missing ? double.NaN : fresh * step;
        double difference = double.IsNaN(a) || double.IsNaN(b) ? double.PositiveInfinity : Math.Abs(a - b);
        // Directions differ by the shorter way round (359.99 and 0.01 degree are 0.02 apart).
        if (variable == WaveParameter.Dir && difference > 180) difference = 360 - difference;
        if (difference > _largest) (_largest, _worst) = (difference, (file, holder, time, variable, cell, a, b));
    }

    /// <summary>The refusal: the step (ISO time), the variable and the largest difference, and that nothing changed.</summary>
    public IngestException ToException()
    {
        var (file, holder, time, variable, cell, old, fresh) = _worst;
        var symbol = variable.Symbol();
        var units = variable.Unit();
        var what = double.IsPositiveInfinity(_largest)
            ? $"it is {(double.IsNaN(fresh) ? "missing" : $"{fresh:G6} {units}")} in {file} and {(double.IsNaN(old) ? "missing" : $"{old:G6} {units}")} in {holder}"
            : $"{fresh:G6} {units} in {file} against {old:G6} {units} in {holder}, a difference of {_largest:G4} {units}";
        return new IngestException(
            $"{file}: time step {YearTimeline.Iso(time)} is also given by {holder} with different values: variable '{symbol}' differs most at cell {cell}: " +
            $"{what} ({_count:N0} value(s) differ at shared steps). A step given twice is stored once when its values are identical; " +
            "pass --replace to replace steps already stored, or leave one of the files out. Nothing was changed.");
    }
}
