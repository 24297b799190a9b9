namespace FreqReadout.Host.Captures;

/// <summary>Where a damaged capture's damage starts and what lies after it (for <c>convert --salvage</c>).</summary>
public sealed class CaptureDamageReport
{
    public CaptureDamageReport(string where, string lost, long rowsLost)
    {
        Where = where;
        Lost = lost;
        RowsLost = rowsLost;
    }

    /// <summary>Where the damage starts: "line 5213" or "block 7 (byte 24576)".</summary>
    public string Where { get; }

    /// <summary>What was not kept, in words: "1 data line, from line 5213 to the end of the file".</summary>
    public string Lost { get; }

    /// <summary>Rows lost when the file tells exactly (data lines after the damage, or a binary end block's total); -1 when it cannot.</summary>
    public long RowsLost { get; }
}
