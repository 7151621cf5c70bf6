namespace Atlas.Ingest.Tests;

/// <summary>
/// Writes hindcast fixtures with netCDF4-python through tests/data/ingest/make_fixture.py (a writer the project did
/// not write), and mirrors its closed-form values.
/// </summary>
public static class FixtureFiles
{
    public static string Folder { get; } = Directory.CreateTempSubdirectory("atlas-ingest-").FullName;

    public static string Make(string name, double startHours, int steps, string extra = "") =>
        TestSupport.NetCdf4PythonFixture.Make(Path.Combine(Folder, name), startHours, steps, extra);

    /// <summary>The values make_fixture.py writes at hour <paramref name="hour"/> (since 2020-01-01) and grid index (j, i).</summary>
    public static (double Hs, double Te, double Tp, double Dir, double Spread) Expected(double hour, int j, int i)
    {
        var hs = 1.0 + 0.5 * j + 0.25 * i + 0.001 * (hour % 97);
        var te = 6.0 + 0.1 * i + 0.01 * (hour % 13);
        return (hs, te, te / 0.9, (200.0 + 10 * j + hour * 0.5) % 360.0, 20.0 + i);
    }

    public static readonly DateTime Epoch = new(2020, 1, 1, 0, 0, 0, DateTimeKind.Utc);
}
