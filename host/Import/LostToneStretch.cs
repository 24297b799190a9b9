using System.Globalization;

namespace FreqReadout.Host.Import;

/// <summary>A stretch of a recording where the beat tone was lost (no edges are taken there).</summary>
public sealed class LostToneStretch
{
    /// <summary>Makes a stretch.</summary>
    public LostToneStretch(double startSeconds, double endSeconds, string reason)
    {
        StartSeconds = startSeconds;
        EndSeconds = endSeconds;
        Reason = reason;
    }

    /// <summary>Start, s from the first sample (a window boundary).</summary>
    public double StartSeconds { get; }

    /// <summary>End, s from the first sample.</summary>
    public double EndSeconds { get; }

    /// <summary>Why: "silence", "clipping" or "a second tone".</summary>
    public string Reason { get; }

    /// <summary>As "12.3-13.1 s: silence".</summary>
    public override string ToString() =>
        string.Create(CultureInfo.InvariantCulture, $"{StartSeconds:0.###}-{EndSeconds:0.###} s: {Reason}");
}
