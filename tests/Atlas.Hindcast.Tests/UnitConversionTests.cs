namespace Atlas.Hindcast.Tests;

public sealed class UnitConversionTests
{
    // Factors: SI Brochure (BIPM) for metre/second prefixes and the radian (1 rad = 180/pi degree);
    // 1 ft = 0.3048 m exactly (international foot, 1959). Exact to 1e-15 relative.
    [Theory]
    [InlineData("m", PhysicalQuantity.Length, 1)]
    [InlineData("metres", PhysicalQuantity.Length, 1)]
    [InlineData("Meters", PhysicalQuantity.Length, 1)]
    [InlineData("meter", PhysicalQuantity.Length, 1)]
    [InlineData("cm", PhysicalQuantity.Length, 0.01)]
    [InlineData("centimetres", PhysicalQuantity.Length, 0.01)]
    [InlineData("mm", PhysicalQuantity.Length, 0.001)]
    [InlineData("0.01 m", PhysicalQuantity.Length, 0.01)]
    [InlineData("1e-3 m", PhysicalQuantity.Length, 0.001)]
    [InlineData("ft", PhysicalQuantity.Length, 0.3048)]
    [InlineData("s", PhysicalQuantity.Time, 1)]
    [InlineData("second", PhysicalQuantity.Time, 1)]
    [InlineData("seconds", PhysicalQuantity.Time, 1)]
    [InlineData("sec", PhysicalQuantity.Time, 1)]
    [InlineData("min", PhysicalQuantity.Time, 60)]
    [InlineData("degree", PhysicalQuantity.Angle, 1)]
    [InlineData("degrees", PhysicalQuantity.Angle, 1)]
    [InlineData("degree_true", PhysicalQuantity.Angle, 1)]
    [InlineData("degrees_true", PhysicalQuantity.Angle, 1)]
    [InlineData("radians", PhysicalQuantity.Angle, 57.295779513082323)]
    [InlineData("rad", PhysicalQuantity.Angle, 57.295779513082323)]
    [InlineData("radian", PhysicalQuantity.Angle, 57.295779513082323)]
    // Spellings real files carry beside the udunits ones (bearings from true north, any case, any run of blanks).
    [InlineData("Degree true", PhysicalQuantity.Angle, 1)]
    [InlineData("degrees  true", PhysicalQuantity.Angle, 1)]
    [InlineData("Degrees_True", PhysicalQuantity.Angle, 1)]
    [InlineData("deg", PhysicalQuantity.Angle, 1)]
    [InlineData("°", PhysicalQuantity.Angle, 1)]
    // Frequencies: 1 Hz = 1 s-1 (SI Brochure); 1 mHz = 0.001 Hz.
    [InlineData("Hz", PhysicalQuantity.Frequency, 1)]
    [InlineData("hertz", PhysicalQuantity.Frequency, 1)]
    [InlineData("s-1", PhysicalQuantity.Frequency, 1)]
    [InlineData("1/s", PhysicalQuantity.Frequency, 1)]
    [InlineData("s^-1", PhysicalQuantity.Frequency, 1)]
    [InlineData("mHz", PhysicalQuantity.Frequency, 0.001)]
    public void KnownUnitsConvertToSi(string units, PhysicalQuantity quantity, double factor)
    {
        var conversion = UnitConversion.ToSi(units, quantity);
        Assert.Equal(factor, conversion.Factor, 1e-15 * factor);
        Assert.Equal(0, conversion.Offset);
    }

    [Theory]
    [InlineData("m s-1", PhysicalQuantity.Length, "units 'm s-1' cannot be converted to metres")]
    [InlineData("M", PhysicalQuantity.Length, "units 'M' cannot be converted to metres")]
    [InlineData("s", PhysicalQuantity.Length, "units 's' cannot be converted to metres")]
    [InlineData("Hz", PhysicalQuantity.Time, "units 'Hz' cannot be converted to seconds")]
    [InlineData("s", PhysicalQuantity.Frequency, "units 's' cannot be converted to hertz")]
    [InlineData("degrees_east", PhysicalQuantity.Angle, "units 'degrees_east' cannot be converted to degrees")]
    [InlineData("degrees_north", PhysicalQuantity.Angle, "units 'degrees_north' cannot be converted to degrees")]
    [InlineData("-1 m", PhysicalQuantity.Length, "units '-1 m' cannot be converted to metres")]
    [InlineData("", PhysicalQuantity.Length, "has no units attribute")]
    [InlineData(null, PhysicalQuantity.Angle, "has no units attribute")]
    public void OtherUnitsAreRefusedNamingTheUnits(string? units, PhysicalQuantity quantity, string message)
    {
        var e = Assert.Throws<FormatException>(() => UnitConversion.ToSi(units, quantity));
        Assert.StartsWith(message, e.Message);
    }
}
