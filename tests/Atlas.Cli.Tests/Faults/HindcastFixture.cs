namespace Atlas.Cli.Tests.Faults;

/// <summary>
/// Hindcast files for the fault tests, written by netCDF4-python through tests/data/ingest/make_fixture.py (a writer
/// the project did not write), whose values are a closed form of (hour, j, i) recomputed by <see cref="Hs"/>.
/// </summary>
public static class HindcastFixture
{
    public static string Make(string folder, string name, int steps, int nx, int ny) =>
        TestSupport.NetCdf4PythonFixture.Make(Path.Combine(folder, name), 0, steps, $"--nx {nx} --ny {ny}");

    /// <summary>Hs that make_fixture.py writes at hour <paramref name="hour"/> since 2020-01-01 and grid index (j, i).</summary>
    public static double Hs(double hour, int j, int i) => 1.0 + 0.5 * j + 0.25 * i + 0.001 * (hour % 97);

    public const double StepHours = 3.0;
}
