namespace Atlas.Assessment.Validation;

/// <summary>What the station parser expects of the order of rows.</summary>
public enum RowOrder
{
    /// <summary>Each row's time must be later than the previous row's; an earlier time is an error.</summary>
    StrictlyIncreasing,
    /// <summary>Rows may come in any order and are sorted by time; duplicate times are still errors.</summary>
    AnyOrder,
}
