using Microsoft.AspNetCore.Mvc;

namespace Atlas.Api.Requests;

/// <summary>The query of <c>GET /point/yield</c> besides the position: the device and the matrix interpolation.</summary>
public sealed record PointYieldQuery(
    [property: FromQuery(Name = "device")] string? Device,
    [property: FromQuery(Name = "interpolation")] string? Interpolation)
{
    /// <summary>The device's name or slug, or null with the fault.</summary>
    public string? DeviceName(QueryErrors errors)
    {
        if (string.IsNullOrWhiteSpace(Device)) errors.Add("device", "device is required: a stored device's name or slug (GET /api/v1/devices).");
        return Device;
    }
}

/// <summary>The query of <c>GET /point/extremes</c> besides the position: the method and the peaks-over-threshold settings.</summary>
public sealed record PointExtremesQuery(
    [property: FromQuery(Name = "method")] string? Method,
    [property: FromQuery(Name = "threshold")] string? Threshold,
    [property: FromQuery(Name = "threshold_quantile")] string? ThresholdQuantile,
    [property: FromQuery(Name = "separation_hours")] string? SeparationHours)
{
    public const string AnnualMaxima = "annual-maxima";
    public const string PeaksOverThreshold = "peaks-over-threshold";

    /// <summary>The one method asked for, or null for both; a fault goes into <paramref name="errors"/>.</summary>
    public string? OneMethod(QueryErrors errors)
    {
        if (Method is not (null or AnnualMaxima or PeaksOverThreshold))
            errors.Add("method", $"'{Method}' is not an extremes method: use annual-maxima or peaks-over-threshold (or leave it out for both).");
        return Method;
    }

    /// <summary>The peaks-over-threshold settings: the defaults, changed by threshold or threshold_quantile and separation_hours.</summary>
    public PeaksOverThresholdOptions PeaksOptions(QueryErrors errors)
    {
        var pot = new PeaksOverThresholdOptions();
        if (AccessLimitsQuery.Positive("threshold", Threshold, "the Hs threshold in metres", errors, required: false) is { } u) pot = pot with { Threshold = u };
        if (AccessLimitsQuery.Positive("threshold_quantile", ThresholdQuantile, "the threshold as a quantile of Hs, between 0 and 1", errors, required: false) is { } q)
        {
            if (q >= 1) errors.Add("threshold_quantile", $"threshold_quantile {ThresholdQuantile} must be below 1 (e.g. 0.99).");
            else pot = pot with { ThresholdQuantile = q };
        }
        if (QueryNumbers.Read("separation_hours", SeparationHours, "the least separation of storm peaks in hours, at or above 0", errors,
                required: false, min: 0) is { } s)
            pot = pot with { SeparationHours = s };
        return pot;
    }
}

/// <summary>The query of <c>GET /layers/yield/{device}.{format}</c>.</summary>
public sealed record YieldLayerQuery([property: FromQuery(Name = "interpolation")] string? Interpolation);
