using SkiaSharp;

namespace FreqReadout.ReportBrowserCheck;

/// <summary>
/// Whether a region of a screenshot holds a plot. A pixel is drawn when it differs from the region's most common colour
/// (its background) by more than <see cref="ColourStep"/> (sum of the absolute red, green and blue differences). A plot
/// (axes, grid lines across the data area, tick labels, traces) has drawn pixels spread over the whole region; a blank
/// region has none, and a broken image (its icon and alt text) has them in a corner. So the region is cut into
/// <see cref="Columns"/> x <see cref="Rows"/> cells and counts as drawn when at least <see cref="MinCoveredShare"/> of the
/// cells hold a drawn pixel. A frame of <see cref="InsetShare"/> of the width and height is left out first, so a border the
/// page style draws around an image does not count. (Chosen on our own pages: plots cover nearly all cells, broken images under a quarter.)
/// </summary>
public static class PlotAreaCheck
{
    /// <summary>A pixel is drawn when it differs from the background by more than this (0-765).</summary>
    public const int ColourStep = 48;

    /// <summary>The share of the width (and of the height) left out on each side before the cells are looked at.</summary>
    public const double InsetShare = 0.02;

    /// <summary>Cells across a region.</summary>
    public const int Columns = 10;

    /// <summary>Cells down a region.</summary>
    public const int Rows = 5;

    /// <summary>The least share of cells with a drawn pixel for a region to count as a plot.</summary>
    public const double MinCoveredShare = 0.6;

    /// <summary>
    /// The share of the <see cref="Columns"/> x <see cref="Rows"/> cells of <paramref name="rect"/> that hold a drawn pixel;
    /// NaN when the rectangle is empty, smaller than the cell grid, or not wholly inside the image.
    /// </summary>
    public static double CoveredShare(SKBitmap shot, PageRect rect)
    {
        if (rect.Width < Columns || rect.Height < Rows || !Inside(shot, rect))
        {
            return double.NaN;
        }

        int dx = Math.Max(2, (int)(rect.Width * InsetShare)), dy = Math.Max(2, (int)(rect.Height * InsetShare));
        rect = new PageRect(rect.Left + dx, rect.Top + dy, rect.Width - 2 * dx, rect.Height - 2 * dy);
        if (rect.Width < Columns || rect.Height < Rows)
        {
            return double.NaN;
        }

        uint background = Background(shot, rect);
        var covered = new bool[Columns * Rows];
        for (int y = rect.Top; y < rect.Top + rect.Height; y++)
        {
            for (int x = rect.Left; x < rect.Left + rect.Width; x++)
            {
                if (Drawn((uint)shot.GetPixel(x, y) & 0x00ffffff, background))
                {
                    covered[(y - rect.Top) * Rows / rect.Height * Columns + (x - rect.Left) * Columns / rect.Width] = true;
                }
            }
        }

        return covered.Count(c => c) / (double)covered.Length;
    }

    /// <summary>The share of drawn pixels in <paramref name="rect"/>; NaN when the rectangle is empty or not wholly inside the image.</summary>
    public static double DrawnShare(SKBitmap shot, PageRect rect)
    {
        if (rect.Width <= 0 || rect.Height <= 0 || !Inside(shot, rect))
        {
            return double.NaN;
        }

        uint background = Background(shot, rect);
        long drawn = 0;
        for (int y = rect.Top; y < rect.Top + rect.Height; y++)
        {
            for (int x = rect.Left; x < rect.Left + rect.Width; x++)
            {
                drawn += Drawn((uint)shot.GetPixel(x, y) & 0x00ffffff, background) ? 1 : 0;
            }
        }

        return (double)drawn / ((long)rect.Width * rect.Height);
    }

    private static bool Inside(SKBitmap shot, PageRect rect) =>
        rect.Left >= 0 && rect.Top >= 0 && rect.Left + rect.Width <= shot.Width && rect.Top + rect.Height <= shot.Height;

    private static bool Drawn(uint c, uint background) =>
        Math.Abs((int)((c >> 16) & 0xff) - (int)((background >> 16) & 0xff))
        + Math.Abs((int)((c >> 8) & 0xff) - (int)((background >> 8) & 0xff))
        + Math.Abs((int)(c & 0xff) - (int)(background & 0xff)) > ColourStep;

    private static uint Background(SKBitmap shot, PageRect rect)
    {
        var counts = new Dictionary<uint, int>();
        for (int y = rect.Top; y < rect.Top + rect.Height; y++)
        {
            for (int x = rect.Left; x < rect.Left + rect.Width; x++)
            {
                uint c = (uint)shot.GetPixel(x, y) & 0x00ffffff;
                counts[c] = counts.GetValueOrDefault(c) + 1;
            }
        }

        return counts.MaxBy(kv => kv.Value).Key;
    }
}
