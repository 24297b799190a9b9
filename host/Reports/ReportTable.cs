namespace FreqReadout.Host.Reports;

/// <summary>
/// A table for a <see cref="ReportPage"/>: column headers and rows of plain text (the page encodes it). A cell that
/// reads as a number (optionally signed, with a unit after a space) is set right-aligned.
/// </summary>
public sealed class ReportTable
{
    private readonly List<string[]> _rows = new();

    /// <summary>A table with these column headers (at least one).</summary>
    /// <exception cref="ArgumentException">No headers.</exception>
    public ReportTable(params string[] headers)
    {
        if (headers == null || headers.Length == 0)
        {
            throw new ArgumentException("a report table needs at least one column", nameof(headers));
        }

        Headers = headers.ToArray();
    }

    /// <summary>The column headers.</summary>
    public IReadOnlyList<string> Headers { get; }

    /// <summary>The rows, each with one cell per header.</summary>
    public IReadOnlyList<IReadOnlyList<string>> Rows => _rows;

    /// <summary>Adds a row.</summary>
    /// <exception cref="ArgumentException">The row has not one cell per header.</exception>
    public ReportTable AddRow(params string[] cells)
    {
        if (cells == null || cells.Length != Headers.Count)
        {
            throw new ArgumentException($"a row of this table needs {Headers.Count} cells, got {cells?.Length ?? 0}", nameof(cells));
        }

        _rows.Add(cells.ToArray());
        return this;
    }
}
