namespace Atlas.Api.Model;

/// <summary>The caution that every response carrying resource figures repeats.</summary>
public static class AtlasCaution
{
    public const string Text =
        "A wave-resource atlas is not a design basis: local codes, site surveys and licensed professional practice govern design and consent.";
}
