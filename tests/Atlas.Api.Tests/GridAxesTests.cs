using Atlas.Api.Rasters;

namespace Atlas.Api.Tests;

public sealed class GridAxesTests
{
    private static double[] SinglePrecisionLinspace(double first, double last, int count) =>
        [.. Enumerable.Range(0, count).Select(k => (double)(float)(first + (last - first) * k / (count - 1)))];

    [Fact]
    public void SinglePrecisionCoordinatesOfAFineGridAreEvenlySpaced()
    {
        // numpy.linspace(49, 51, 500).astype(float32) and linspace(-31, -28, 600): the axes a CF file of a fine
        // regular grid stores as float; each misses its even position by about 0.1 % of a spacing.
        var axes = new GridAxes(SinglePrecisionLinspace(-31, -28, 600), SinglePrecisionLinspace(49, 51, 500));
        Assert.True(axes.IsUniform);
        Assert.Equal(2.0 / 499, axes.LatitudeSpacing, 1e-9);
    }

    [Fact]
    public void AnAxisWithOneCoordinateOffByAFewPercentOfASpacingIsNotEven()
    {
        var latitudes = SinglePrecisionLinspace(49, 51, 500);
        latitudes[250] += 0.05 * (2.0 / 499);
        Assert.False(new GridAxes(SinglePrecisionLinspace(-31, -28, 600), latitudes).IsUniform);
    }
}
