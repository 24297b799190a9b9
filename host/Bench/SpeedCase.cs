namespace FreqReadout.Host.Bench;

/// <summary>One process the speed bench times: a name, what it measures, and its command line after <c>freqreadout</c>.</summary>
/// <param name="Name">Short name (the table's first column).</param>
/// <param name="What">What the case does, in words.</param>
/// <param name="Arguments">Arguments after the program.</param>
/// <param name="Edges">Edges the case reads or writes (0: not a per-edge case), for the edges/s column.</param>
/// <param name="RowByRow">True to run it on the line-based, row-by-row reading path (the oracle; FREQREADOUT_ROW_READER=1).</param>
public sealed record SpeedCase(string Name, string What, IReadOnlyList<string> Arguments, long Edges, bool RowByRow = false);
