namespace FreqReadout.Tests.DeviceFit;

/// <summary>One line of the per-gate budget: which entries are counted, which calls are known not to be taken in this case, and what one run of it is.</summary>
internal sealed class BudgetRow
{
    public BudgetRow(string label, string per, IReadOnlyList<string> entries)
    {
        Label = label;
        Per = per;
        Entries = entries;
    }

    /// <summary>What the row counts, in words.</summary>
    public string Label { get; }

    /// <summary>What one run is, plural, for the per-second columns: "reads", "gates", "refreshes".</summary>
    public string Per { get; }

    public IReadOnlyList<string> Entries { get; }

    /// <summary>Calls not followed: branches that are not taken in the case this row describes.</summary>
    public IReadOnlyList<string> Excluded { get; init; } = [];

    /// <summary>Loop bounds fixed for this case, by "Type.Method#k".</summary>
    public IReadOnlyDictionary<string, long> Overrides { get; init; } = new Dictionary<string, long>();

    /// <summary>Counts one pass of this loop ("Type.Method#k") of the single entry instead of the whole entry.</summary>
    public string? OnePassOf { get; init; }
}
