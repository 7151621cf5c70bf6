namespace Atlas.Hindcast;

/// <summary>
/// Which points are sea. The rule: a point is dry when the file has a depth and that depth is missing or not
/// positive (at or above the surface), or when Hs is missing at every step of the probe slab (the first steps of
/// the file, <see cref="HindcastFile.ReadWetMask"/>). Without a depth variable only the Hs rule applies.
/// </summary>
public static class LandMask
{
    /// <summary>Sets <c>seen[p]</c> for every point with a finite Hs at any step of <paramref name="hsSteps"/> ([time][point]).</summary>
    public static void MarkHsSeen(ReadOnlySpan<float> hsSteps, Span<bool> seen)
    {
        int points = seen.Length;
        if (points == 0) return;
        if (hsSteps.Length % points != 0) throw new ArgumentException("the slab must hold whole steps of every point", nameof(hsSteps));
        for (int k = 0; k < hsSteps.Length; k++)
            if (float.IsFinite(hsSteps[k])) seen[k % points] = true;
    }

    /// <summary>
    /// The wet flag of every point. <paramref name="depthMetres"/> is empty when the file has no depth; otherwise
    /// one value per point, positive down, NaN where missing.
    /// </summary>
    public static bool[] Derive(ReadOnlySpan<float> depthMetres, ReadOnlySpan<bool> hsSeen)
    {
        if (!depthMetres.IsEmpty && depthMetres.Length != hsSeen.Length)
            throw new ArgumentException("one depth per point is required", nameof(depthMetres));
        var wet = new bool[hsSeen.Length];
        for (int p = 0; p < wet.Length; p++)
            wet[p] = hsSeen[p] && (depthMetres.IsEmpty || depthMetres[p] > 0);
        return wet;
    }
}
