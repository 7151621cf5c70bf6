using System.ComponentModel.DataAnnotations;

namespace Atlas.Ingest.Validation;

/// <summary>
/// The distance limit between a station and its cell as <c>atlas validate</c> reads it, from its own section
/// <c>StationValidation</c> (<c>StationValidation:PointMaxDistanceKm</c>, <c>StationValidation:PointMaxDistanceGridSpacings</c>).
/// A key the section does not give is read from the API's section (<c>AtlasApiOptions:PointMaxDistanceKm</c>, ...), so
/// that by default one setting governs point requests and every validation, whichever process runs it (and existing
/// configurations keep working); the ranges are the API's too.
/// </summary>
public sealed class StationCellOptions
{
    /// <summary>The configuration section of the command line's validation.</summary>
    public const string Section = "StationValidation";

    /// <summary>The API's section, read first: <see cref="Section"/> overrides what it gives.</summary>
    public const string FallbackSection = "AtlasApiOptions";

    /// <summary>The farthest a station may lie from the nearest wet cell, km; unset: a multiple of the typical cell spacing.</summary>
    [Range(0.001, 10_000)]
    public double? PointMaxDistanceKm { get; set; }

    /// <summary>The distance limit in typical cell spacings, used when <see cref="PointMaxDistanceKm"/> is unset.</summary>
    [Range(0.5, 100)]
    public double PointMaxDistanceGridSpacings { get; set; } = 2.0;
}
