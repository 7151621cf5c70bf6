using Atlas.Hindcast.Spectra;

namespace Atlas.Hindcast.Tests;

/// <summary>
/// Spellings of a variance density's units as udunits and spectral models write them (udunits grammar: products by space,
/// dot or asterisk, exponents as "2", "^2" or "**2", divisions by "/"; common practice for the model spellings).
/// </summary>
public class SpectralDensityUnitsTests
{
    [Theory]
    [InlineData("m2 s rad-1", true, 1.0)]
    [InlineData("m^2 s rad^-1", true, 1.0)]
    [InlineData("m**2 s rad**-1", true, 1.0)]
    [InlineData("m2/Hz/rad", true, 1.0)]
    [InlineData("m2 Hz-1 rad-1", true, 1.0)]
    [InlineData("m2 s degree-1", true, 180 / Math.PI)]
    [InlineData("m2 Hz-1 degree-1", true, 180 / Math.PI)]
    [InlineData("m^2/Hz/deg", true, 180 / Math.PI)]
    [InlineData("cm2 s rad-1", true, 1e-4)]
    [InlineData("m2 s", false, 1.0)]
    [InlineData("m2/Hz", false, 1.0)]
    [InlineData("m^2 Hz^-1", false, 1.0)]
    public void KnownSpellingsConvertToTheAtlasUnit(string units, bool directional, double factor)
    {
        var (actual, conversion) = SpectralDensityUnits.ToSi(units, directional);
        Assert.Equal(factor, actual, 1e-12 * factor);
        Assert.Equal(factor == 1.0, conversion == "none");
    }

    [Theory]
    [InlineData(null, true, "no units attribute")]
    [InlineData("m2 s", true, "not a directional variance density")]
    [InlineData("m2 s rad-1", false, "not a variance density")]
    [InlineData("m s rad-1", true, "not a directional variance density")]
    [InlineData("m2 s furlong-1", true, "does not know")]
    public void OtherUnitsAreRefusedNamingThem(string? units, bool directional, string problem)
    {
        var error = Assert.Throws<FormatException>(() => SpectralDensityUnits.ToSi(units, directional));
        Assert.Contains(problem, error.Message);
    }
}
