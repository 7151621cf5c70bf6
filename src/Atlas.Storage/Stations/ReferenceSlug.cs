using System.Globalization;
using System.Text;

namespace Atlas.Storage.Stations;

/// <summary>
/// The URL name of a station or a device: the name lower-cased, letters and digits kept (accents dropped), every other
/// run of characters turned into one hyphen, at most 63 characters ("Gannetby Deep" becomes "gannetby-deep").
/// </summary>
public static class ReferenceSlug
{
    public const int MaximumLength = 63;

    /// <summary>The slug of <paramref name="name"/>, or null when the name holds no letter or digit.</summary>
    public static string? From(string name)
    {
        ArgumentNullException.ThrowIfNull(name);
        var text = new StringBuilder(name.Length);
        var pendingHyphen = false;
        foreach (var c in name.Normalize(NormalizationForm.FormD))
        {
            if (CharUnicodeInfo.GetUnicodeCategory(c) == UnicodeCategory.NonSpacingMark) continue;
            var lower = char.ToLowerInvariant(c);
            if (lower is (>= 'a' and <= 'z') or (>= '0' and <= '9'))
            {
                if (pendingHyphen && text.Length > 0) text.Append('-');
                pendingHyphen = false;
                text.Append(lower);
            }
            else pendingHyphen = true;
        }
        if (text.Length == 0) return null;
        var slug = text.ToString();
        return slug.Length <= MaximumLength ? slug : slug[..MaximumLength].TrimEnd('-');
    }
}
