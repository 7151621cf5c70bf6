namespace Atlas.Assessment.Validation;

/// <summary>A parsed station record: observations sorted by time, flagged rows kept and counted.</summary>
public sealed class StationRecord
{
    internal StationRecord(string sourceName, StationObservation[] observations, bool hasTp, bool hasTe, bool hasDirection)
    {
        SourceName = sourceName;
        Observations = observations;
        HasTp = hasTp;
        HasTe = hasTe;
        HasDirection = hasDirection;
        FlaggedCount = observations.Count(o => o.IsFlagged);
    }

    /// <summary>Name of the input the record was read from.</summary>
    public string SourceName { get; }

    /// <summary>All rows, sorted by time, flagged ones included (see <see cref="StationObservation.IsFlagged"/>).</summary>
    public IReadOnlyList<StationObservation> Observations { get; }

    /// <summary>Rows the station's quality control rejected (<c>qc</c> other than 0).</summary>
    public int FlaggedCount { get; }

    /// <summary>The record has a <c>tp_s</c> column.</summary>
    public bool HasTp { get; }

    /// <summary>The record has a <c>te_s</c> column.</summary>
    public bool HasTe { get; }

    /// <summary>The record has a <c>dir_deg</c> column.</summary>
    public bool HasDirection { get; }

    /// <summary>True when the record carries <paramref name="variable"/>.</summary>
    public bool Has(WaveParameter variable) => variable switch
    {
        WaveParameter.Hs => true,
        WaveParameter.Tp => HasTp,
        WaveParameter.Te => HasTe,
        WaveParameter.Dir => HasDirection,
        _ => false,
    };
}
