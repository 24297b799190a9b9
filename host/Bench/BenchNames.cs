namespace FreqReadout.Host.Bench;

/// <summary>The bench's names for kinds, modes and ways, as printed and as accepted by <c>--kinds</c>.</summary>
public static class BenchNames
{
    /// <summary>settling, ramp, onset or mains.</summary>
    public static string Of(BenchKind kind) => kind switch
    {
        BenchKind.Settling => "settling",
        BenchKind.Ramp => "ramp",
        BenchKind.Onset => "onset",
        _ => "mains",
    };

    /// <summary>search, beat-above, beat-below or snapshots.</summary>
    public static string Of(BenchMode mode) => mode switch
    {
        BenchMode.Search => "search",
        BenchMode.BeatAbove => "beat-above",
        BenchMode.BeatBelow => "beat-below",
        _ => "snapshots",
    };

    /// <summary>readout, fixed-3s or moving-10s.</summary>
    public static string Of(BenchWay way) => way switch
    {
        BenchWay.Readout => "readout",
        BenchWay.FixedBaseline => "fixed-3s",
        _ => "moving-10s",
    };

    /// <summary>The kind named <paramref name="name"/> (case-insensitive); false for any other text.</summary>
    public static bool TryParseKind(string name, out BenchKind kind)
    {
        foreach (BenchKind k in Enum.GetValues<BenchKind>())
        {
            if (string.Equals(Of(k), name.Trim(), StringComparison.OrdinalIgnoreCase))
            {
                kind = k;
                return true;
            }
        }

        kind = BenchKind.Settling;
        return false;
    }
}
