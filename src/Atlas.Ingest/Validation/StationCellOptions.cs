using System.ComponentModel.DataAnnotations;

namespace Atlas.Ingest.Validation;

/// <summary>
/// The point distance limit as the command line reads it. The keys are the API's (<c>AtlasApiOptions:PointMaxDistanceKm</c>,
/// <c>AtlasApiOptions:PointMaxDistanceGridSpacings</c>), so one setting governs point requests and every validation,
/// whichever process runs it; the ranges are the API's too.
/// </summary>
public sealed class StationCellOptions
{
    /// <summary>The configuration section the keys live in.</summary>
    public const string Section = "AtlasApiOptions";

    /// <summary>The farthest a station may lie from the nearest wet cell, km; unset: a multiple of the typical cell spacing.</summary>
    [Range(0.001, 10_000)]
    public double? PointMaxDistanceKm { get; set; }

    /// <summary>The distance limit in typical cell spacings, used when <see cref="PointMaxDistanceKm"/> is unset.</summary>
    [Range(0.5, 100)]
    public double PointMaxDistanceGridSpacings { get; set; } = 2.0;
}
