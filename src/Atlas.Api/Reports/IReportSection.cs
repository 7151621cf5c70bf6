namespace Atlas.Api.Reports;

/// <summary>A part of a report that knows how many pages it fills before it draws them, so every page can say "page n of N".</summary>
public interface IReportSection
{
    /// <summary>Pages the section fills (0 when it has nothing to show).</summary>
    int Pages { get; }

    /// <summary>Draws page <paramref name="index"/> (0-based, within the section).</summary>
    void Draw(ReportPage page, int index);
}
