using SkiaSharp;

namespace Atlas.Api.Reports;

/// <summary>
/// One A4 page of a report being drawn, in PDF points (1/72 inch), with the house fonts and the few drawing moves the
/// sections share: text (wrapped or not), a heading, a table row. <see cref="Y"/> is where the next line starts.
/// </summary>
public sealed class ReportPage(SKCanvas canvas, ReportFonts fonts)
{
    public const float Width = 595, Height = 842, Margin = 42, Top = 64, Bottom = Height - 70;
    public const float ContentWidth = Width - 2 * Margin;

    public SKCanvas Canvas => canvas;
    public ReportFonts Fonts => fonts;
    public float Y { get; set; } = Top;

    public static readonly SKColor Ink = new(0x1E, 0x22, 0x26);
    public static readonly SKColor Faint = new(0x6A, 0x70, 0x76);
    public static readonly SKColor Rule = new(0xC8, 0xCC, 0xD0);

    /// <summary>The height a heading takes, and a subheading.</summary>
    public const float HeadingHeight = 28, SubheadingHeight = 17;

    /// <summary>A section heading, with space above it.</summary>
    public void Heading(string text)
    {
        Text(text, Margin, Y + 19, fonts.Heading, Ink);
        Y += HeadingHeight;
    }

    /// <summary>A smaller heading inside a section.</summary>
    public void Subheading(string text)
    {
        Text(text, Margin, Y + 12, fonts.Bold, Ink);
        Y += SubheadingHeight;
    }

    /// <summary>The height <see cref="Paragraph"/> gives the text.</summary>
    public static float ParagraphHeight(string text, SKFont font, float width) => Wrap(text, font, width).Count() * font.Size * 1.35f + 3;

    /// <summary>Text wrapped to <paramref name="width"/> from <see cref="Y"/> down; moves <see cref="Y"/> below it.</summary>
    public void Paragraph(string text, SKFont? font = null, float x = Margin, float width = ContentWidth, SKColor? colour = null)
    {
        font ??= fonts.Body;
        var lineHeight = font.Size * 1.35f;
        foreach (var line in Wrap(text, font, width))
        {
            Text(line, x, Y + font.Size, font, colour ?? Ink);
            Y += lineHeight;
        }
        Y += 3;
    }

    /// <summary>One line of text with its baseline at <paramref name="y"/>.</summary>
    public void Text(string text, float x, float y, SKFont font, SKColor colour, SKTextAlign align = SKTextAlign.Left)
    {
        using var paint = new SKPaint { Color = colour, IsAntialias = true };
        canvas.DrawText(text, x, y, align, font, paint);
    }

    /// <summary>
    /// A table: a header row (its cells may break into lines at a newline), then the rows; the first column left-aligned, the others right-aligned, columns as wide
    /// as <paramref name="widths"/> (points). A light rule under the header and the last row.
    /// </summary>
    public void Table(IReadOnlyList<string> header, IEnumerable<IReadOnlyList<string>> rows, IReadOnlyList<float> widths, SKFont? font = null)
    {
        font ??= fonts.Small;
        var rowHeight = font.Size * 1.55f;
        // A header cell may break into lines at '\n' (a name over its unit).
        var headerLines = header.Max(h => h.Split('\n').Length);
        for (var line = 0; line < headerLines; line++)
            DrawRow(header.Select(h => h.Split('\n') is var parts && line < parts.Length ? parts[line] : "").ToArray(), widths, fonts.SmallBold);
        using var rule = new SKPaint { Color = Rule, StrokeWidth = 0.7f, IsStroke = true };
        canvas.DrawLine(Margin, Y - rowHeight * 0.3f, Margin + widths.Sum(), Y - rowHeight * 0.3f, rule);
        foreach (var row in rows) DrawRow(row, widths, font);
        canvas.DrawLine(Margin, Y - rowHeight * 0.3f, Margin + widths.Sum(), Y - rowHeight * 0.3f, rule);
        Y += 4;

        void DrawRow(IReadOnlyList<string> cells, IReadOnlyList<float> w, SKFont f)
        {
            var x = Margin;
            for (var k = 0; k < cells.Count; k++)
            {
                if (k == 0) Text(cells[k], x + 2, Y + f.Size, f, Ink);
                else Text(cells[k], x + w[k] - 3, Y + f.Size, f, Ink, SKTextAlign.Right);
                x += w[k];
            }
            Y += rowHeight;
        }
    }

    /// <summary>The text broken into lines no wider than <paramref name="width"/> at spaces (a word longer than the width stands alone).</summary>
    public static IEnumerable<string> Wrap(string text, SKFont font, float width)
    {
        foreach (var paragraph in text.Split('\n'))
        {
            var line = new StringBuilder();
            foreach (var word in paragraph.Split(' ', StringSplitOptions.RemoveEmptyEntries))
            {
                var candidate = line.Length == 0 ? word : line + " " + word;
                if (line.Length > 0 && font.MeasureText(candidate) > width)
                {
                    yield return line.ToString();
                    line.Clear().Append(word);
                }
                else line.Clear().Append(candidate);
            }
            yield return line.ToString();
        }
    }
}
