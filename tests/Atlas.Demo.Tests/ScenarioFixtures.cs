namespace Atlas.Demo.Tests;

/// <summary>
/// A reduced demo written once to a temporary folder: two winter months, 6-hourly, on a 45 x 35
/// grid over the same coast, with hourly buoys. Deleted when the tests are done.
/// </summary>
public sealed class WrittenScenarioFixture : IDisposable
{
    public static DemoScenarioOptions Options { get; } = DemoScenarioOptions.Full with
    {
        Months = 2,
        StepHours = 6,
        Columns = 45,
        Rows = 35,
    };

    public string Folder { get; } = Path.Combine(Path.GetTempPath(), "atlas-demo-tests-" + Guid.NewGuid().ToString("N"));

    public DemoScenarioOutput Output { get; }

    public WrittenScenarioFixture()
    {
        Output = DemoScenarioWriter.Write(Folder, Options);
        Grid = new DemoGrid(Options.Columns, Options.Rows);
        Model = new SeaStateModel(Grid, new OffshoreForcing(Options.Seed, Options.Start, Options.End));
        _firstMonth = new Lazy<MonthlyFields>(() =>
        {
            var fields = MonthlyFields.Generate(Model, Options.Start, Options.StepHours);
            fields.RoundToSignificantBits(MonthlyHindcastFileWriter.KeptMantissaBits);
            return fields;
        });
    }

    /// <summary>The reduced grid, rebuilt independently of the writer.</summary>
    public DemoGrid Grid { get; }

    /// <summary>The reduced scenario's model, rebuilt independently of the writer.</summary>
    public SeaStateModel Model { get; }

    private readonly Lazy<MonthlyFields> _firstMonth;

    /// <summary>The first month regenerated and rounded as the writer does, to compare files against.</summary>
    public MonthlyFields FirstMonth => _firstMonth.Value;

    public string PathOf(string name) => Path.Combine(Folder, name);

    public void Dispose()
    {
        try { Directory.Delete(Folder, recursive: true); }
        catch (IOException) { }
    }
}

/// <summary>The full-resolution model with three years of forcing, built once (the tables take about a second).</summary>
public sealed class FullModelFixture
{
    public DemoScenarioOptions Options { get; } = DemoScenarioOptions.Full;
    public DemoGrid Grid { get; }
    public SeaStateModel Model { get; }

    public FullModelFixture()
    {
        Grid = new DemoGrid(Options.Columns, Options.Rows);
        Model = new SeaStateModel(Grid, new OffshoreForcing(Options.Seed, Options.Start, Options.End));
    }

    /// <summary>Wet cells whose centres lie in a box of the local kilometre frame.</summary>
    public int[] CellsIn(double xMinKm, double xMaxKm, double yMinKm, double yMaxKm) =>
        [.. Enumerable.Range(0, Grid.WetCount).Where(k =>
            Grid.XKm[k] >= xMinKm && Grid.XKm[k] <= xMaxKm && Grid.YKm[k] >= yMinKm && Grid.YKm[k] <= yMaxKm)];

    /// <summary>The states of wet cell k every <paramref name="stepHours"/> hours over the whole period.</summary>
    public IEnumerable<(DateTime Time, SeaState State)> Series(int k, int stepHours)
    {
        for (var t = Options.Start; t < Options.End; t = t.AddHours(stepHours))
            yield return (t, Model.Evaluate(k, t));
    }
}

[CollectionDefinition(Name)]
public sealed class FullModelCollection : ICollectionFixture<FullModelFixture>
{
    public const string Name = "full model";
}

[CollectionDefinition(Name)]
public sealed class WrittenScenarioCollection : ICollectionFixture<WrittenScenarioFixture>
{
    public const string Name = "written scenario";
}
