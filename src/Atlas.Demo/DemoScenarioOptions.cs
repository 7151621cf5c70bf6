namespace Atlas.Demo;

/// <summary>
/// What to generate. The defaults are the full demo (three years, 3-hourly, 90 x 70 cells);
/// tests shrink the period, the step and the grid. The coast itself is defined in kilometres,
/// so a coarser grid samples the same geography.
/// </summary>
public sealed record DemoScenarioOptions
{
    /// <summary>Seed of every random stream; the same seed gives byte-identical output.</summary>
    public ulong Seed { get; init; } = 5_020_261;

    /// <summary>First instant of the hindcast (UTC, first day of a month, midnight).</summary>
    public DateTime Start { get; init; } = new(2021, 1, 1, 0, 0, 0, DateTimeKind.Utc);

    /// <summary>Number of whole calendar months to generate.</summary>
    public int Months { get; init; } = 36;

    /// <summary>Hours between hindcast fields; must divide 24.</summary>
    public int StepHours { get; init; } = 3;

    /// <summary>Grid columns (longitude) across the fixed bounding box.</summary>
    public int Columns { get; init; } = 90;

    /// <summary>Grid rows (latitude) across the fixed bounding box.</summary>
    public int Rows { get; init; } = 70;

    /// <summary>Minutes between buoy records; must divide 60 or be a multiple of 60 dividing 24 h.</summary>
    public int BuoyIntervalMinutes { get; init; } = 60;

    /// <summary>The full demo.</summary>
    public static DemoScenarioOptions Full { get; } = new();

    /// <summary>End of the hindcast (exclusive).</summary>
    public DateTime End => Start.AddMonths(Months);

    /// <summary>Throws when an option is out of range, naming it.</summary>
    public void Validate()
    {
        if (Start.Kind != DateTimeKind.Utc || Start.Day != 1 || Start.TimeOfDay != TimeSpan.Zero)
            throw new ArgumentOutOfRangeException(nameof(Start), Start, "Start must be midnight UTC on the first day of a month.");
        if (Months is < 1 or > 600)
            throw new ArgumentOutOfRangeException(nameof(Months), Months, "Months must be between 1 and 600.");
        if (StepHours < 1 || 24 % StepHours != 0)
            throw new ArgumentOutOfRangeException(nameof(StepHours), StepHours, "StepHours must divide 24 (1, 2, 3, 4, 6, 8, 12 or 24).");
        if (Columns is < 12 or > 1000)
            throw new ArgumentOutOfRangeException(nameof(Columns), Columns, "Columns must be between 12 and 1000.");
        if (Rows is < 10 or > 1000)
            throw new ArgumentOutOfRangeException(nameof(Rows), Rows, "Rows must be between 10 and 1000.");
        bool subHourly = BuoyIntervalMinutes is > 0 and <= 60 && 60 % BuoyIntervalMinutes == 0;
        bool multiHourly = BuoyIntervalMinutes > 60 && BuoyIntervalMinutes % 60 == 0 && 24 % (BuoyIntervalMinutes / 60) == 0;
        if (!subHourly && !multiHourly)
            throw new ArgumentOutOfRangeException(nameof(BuoyIntervalMinutes), BuoyIntervalMinutes, "BuoyIntervalMinutes must divide 60 minutes, or be whole hours dividing 24.");
    }
}
