namespace Atlas.Assessment.Tests;

/// <summary>Unix seconds of a UTC date and time, for building test series.</summary>
internal static class UnixSeconds
{
    public static long Of(DateTime utc) => new DateTimeOffset(utc).ToUnixTimeSeconds();
}
