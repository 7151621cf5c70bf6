using SkiaSharp;

namespace Atlas.Api.Reports;

/// <summary>A piece of running text in a <see cref="FlowSection"/>.</summary>
public sealed record FlowBlock(FlowBlockKind Kind, string Text);

public enum FlowBlockKind { Heading, Subheading, Paragraph, Small, Emphasis }

/// <summary>
/// Running text (headings and paragraphs) that continues on as many pages as it needs: the blocks are measured with
/// the report's fonts before drawing, so the section knows its page count and a heading never ends a page.
/// </summary>
public sealed class FlowSection : IReportSection
{
    private readonly List<List<FlowBlock>> _pages = [];

    public FlowSection(IReadOnlyList<FlowBlock> blocks)
    {
        using var fonts = new ReportFonts();
        var page = new List<FlowBlock>();
        var used = 0f;
        const float available = ReportPage.Bottom - ReportPage.Top - 6;
        for (var k = 0; k < blocks.Count; k++)
        {
            var height = Height(blocks[k], fonts);
            // A heading keeps the first block after it on its page.
            var keep = blocks[k].Kind is FlowBlockKind.Heading or FlowBlockKind.Subheading && k + 1 < blocks.Count ? Height(blocks[k + 1], fonts) : 0;
            if (page.Count > 0 && used + height + keep > available)
            {
                _pages.Add(page);
                page = [];
                used = 0;
            }
            page.Add(blocks[k]);
            used += height;
        }
        if (page.Count > 0) _pages.Add(page);
    }

    public int Pages => _pages.Count;

    public void Draw(ReportPage page, int index)
    {
        foreach (var block in _pages[index])
            switch (block.Kind)
            {
                case FlowBlockKind.Heading: page.Heading(block.Text); break;
                case FlowBlockKind.Subheading: page.Subheading(block.Text); break;
                case FlowBlockKind.Small: page.Paragraph(block.Text, page.Fonts.Small); break;
                case FlowBlockKind.Emphasis: page.Paragraph(block.Text, page.Fonts.Bold); break;
                default: page.Paragraph(block.Text); break;
            }
    }

    /// <summary>The height a block takes, as <see cref="ReportPage"/> draws it.</summary>
    private static float Height(FlowBlock block, ReportFonts fonts) => block.Kind switch
    {
        FlowBlockKind.Heading => ReportPage.HeadingHeight,
        FlowBlockKind.Subheading => ReportPage.SubheadingHeight,
        _ => ReportPage.ParagraphHeight(block.Text, FontOf(block.Kind, fonts), ReportPage.ContentWidth),
    };

    private static SKFont FontOf(FlowBlockKind kind, ReportFonts fonts) => kind switch
    {
        FlowBlockKind.Small => fonts.Small,
        FlowBlockKind.Emphasis => fonts.Bold,
        _ => fonts.Body,
    };
}
