using ScottPlot;

namespace FreqReadout.Host.Reports;

/// <summary>
/// The colours of every report plot, the project's own, chosen to stay apart printed in grey: their luma
/// (Y' = 0.2126 R' + 0.7152 G' + 0.0722 B', ITU-R BT.709, from memory) steps from dark to light by at least 0.15 of
/// full scale, white paper included (ReportPaletteTests). Class and kind are told by marker shape and line width too.
/// </summary>
public static class ReportPalette
{
    /// <summary>The main trace (baseline, shift, the robust normal, Allan deviation): navy ink, luma about 0.16.</summary>
    public static readonly Color Ink = Color.FromHex(InkHex);

    /// <summary>The second trace (threshold band, the moment normal): deep ochre, luma about 0.42.</summary>
    public static readonly Color Mid = Color.FromHex(MidHex);

    /// <summary>Background traces (counted frequency, re-baselines, bar outlines, modified deviation): slate, luma about 0.64.</summary>
    public static readonly Color Light = Color.FromHex(LightHex);

    /// <summary>Filled areas (histogram bars): pale grey-blue, luma about 0.82.</summary>
    public static readonly Color Fill = Color.FromHex(FillHex);

    /// <summary>Hex of <see cref="Ink"/>.</summary>
    public const string InkHex = "#1b2a41";

    /// <summary>Hex of <see cref="Mid"/>.</summary>
    public const string MidHex = "#8a6a10";

    /// <summary>Hex of <see cref="Light"/>.</summary>
    public const string LightHex = "#9aa5b1";

    /// <summary>Hex of <see cref="Fill"/>.</summary>
    public const string FillHex = "#cdd1d6";
}
