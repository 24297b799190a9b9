using System.Globalization;
using FreqReadout.Host.Reports;

namespace FreqReadout.Tests.Reports;

/// <summary>The plot colours stay apart printed in grey.</summary>
public sealed class ReportPaletteTests
{
    [Fact]
    public void Every_colour_and_the_paper_differ_in_luma_by_at_least_015()
    {
        // Luma Y' = 0.2126 R' + 0.7152 G' + 0.0722 B' on the gamma-encoded values (ITU-R BT.709-6, item 3.2; from memory).
        // The 0.15 step is common practice for grey-print legibility, no source.
        var levels = new (string Name, double Luma)[]
        {
            ("ink", Luma(ReportPalette.InkHex)),
            ("mid", Luma(ReportPalette.MidHex)),
            ("light", Luma(ReportPalette.LightHex)),
            ("fill", Luma(ReportPalette.FillHex)),
            ("white paper", 1.0),
        };
        for (int i = 0; i < levels.Length; i++)
        {
            for (int j = i + 1; j < levels.Length; j++)
            {
                double step = Math.Abs(levels[i].Luma - levels[j].Luma);
                Assert.True(step >= 0.15, $"{levels[i].Name} ({levels[i].Luma:0.000}) and {levels[j].Name} ({levels[j].Luma:0.000}) differ by only {step:0.000} in grey");
            }
        }

        // The palette's ScottPlot colours are its hex values.
        Assert.Equal(ReportPalette.MidHex.TrimStart('#'), ReportPalette.Mid.ToHex().TrimStart('#')[..6], ignoreCase: true);
    }

    private static double Luma(string hex)
    {
        int rgb = int.Parse(hex.TrimStart('#'), NumberStyles.HexNumber, CultureInfo.InvariantCulture);
        return (0.2126 * ((rgb >> 16) & 0xff) + 0.7152 * ((rgb >> 8) & 0xff) + 0.0722 * (rgb & 0xff)) / 255.0;
    }
}
