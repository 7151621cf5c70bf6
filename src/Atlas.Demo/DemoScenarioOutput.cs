namespace Atlas.Demo;

/// <summary>One file the demo wrote.</summary>
/// <param name="Name">File name within the output folder.</param>
/// <param name="Bytes">Size, bytes.</param>
public sealed record DemoFile(string Name, long Bytes);

/// <summary>What <see cref="DemoScenarioWriter.Write(string, DemoScenarioOptions?, IProgress{DemoProgress}?)"/> produced.</summary>
/// <param name="Folder">The output folder (full path).</param>
/// <param name="Scenario">The scenario description.</param>
/// <param name="Files">Every file written, hindcast files first in time order.</param>
/// <param name="Elapsed">Wall-clock time of the run.</param>
public sealed record DemoScenarioOutput(string Folder, DemoScenario Scenario, IReadOnlyList<DemoFile> Files, TimeSpan Elapsed)
{
    /// <summary>Total bytes written.</summary>
    public long TotalBytes => Files.Sum(f => f.Bytes);
}

/// <summary>Progress of a demo run: <paramref name="Done"/> of <paramref name="Total"/> files, the last one named.</summary>
public readonly record struct DemoProgress(int Done, int Total, string LastFile);
