namespace Atlas.Hindcast;

/// <summary>A variable named like the water depth that was not taken for it.</summary>
/// <param name="Name">The file variable.</param>
/// <param name="Reason">Why it was not taken, e.g. "it has no units".</param>
/// <param name="OnTheWaveGrid">True when it spans the horizontal dimensions of Hs, so a mapping file can name it.</param>
public sealed record DepthLookalike(string Name, string Reason, bool OnTheWaveGrid);
