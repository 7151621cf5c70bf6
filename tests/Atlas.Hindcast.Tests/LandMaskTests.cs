namespace Atlas.Hindcast.Tests;

/// <summary>The wet/dry rule (common practice: a cell with no sea floor below the surface or never any waves is land).</summary>
public sealed class LandMaskTests
{
    [Fact]
    public void PointIsDryWhenDepthIsMissingOrNotPositive()
    {
        var seen = new[] { true, true, true, true };
        Assert.Equal([true, false, false, false], LandMask.Derive([10f, float.NaN, 0f, -3f], seen));
    }

    [Fact]
    public void PointIsDryWhenHsIsMissingAtEveryProbedStep()
    {
        var seen = new bool[3];
        // two steps of three points: point 1 never has Hs, point 2 only at the second step
        LandMask.MarkHsSeen([1f, float.NaN, float.NaN, 1.5f, float.NaN, 2f], seen);
        Assert.Equal([true, false, true], seen);
        Assert.Equal([true, false, true], LandMask.Derive([], seen));
    }

    [Fact]
    public void SlabOfPartialStepsIsMisuse() =>
        Assert.Throws<ArgumentException>(() => LandMask.MarkHsSeen([1f, 2f, 3f], new bool[2]));
}
