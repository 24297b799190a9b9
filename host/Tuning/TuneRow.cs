namespace FreqReadout.Host.Tuning;

/// <summary>What a replay with one value of the varied setting found (or why it could not run).</summary>
/// <param name="Value">The value.</param>
/// <param name="Error">Why this value could not be replayed (out of its range...), or null.</param>
/// <param name="Gates">Gates replayed.</param>
/// <param name="Events">Detection events.</param>
/// <param name="Ferrous">Events classed ferrous.</param>
/// <param name="NonFerrous">Events classed non-ferrous.</param>
/// <param name="Unclear">Events classed unclear.</param>
/// <param name="Rebaselines">Re-baselines after the first baseline.</param>
/// <param name="Warnings">Warnings of the replay.</param>
/// <param name="PassesFound">With a truth file: passes with an event (as demo matches them), else null.</param>
/// <param name="ClassRight">With a truth file: found passes classed as the sign rule says, else null.</param>
/// <param name="FalseEvents">With a truth file: events matching no pass, else null.</param>
public sealed record TuneRow(double Value, string? Error, long Gates, int Events, int Ferrous, int NonFerrous, int Unclear, int Rebaselines, int Warnings, int? PassesFound = null, int? ClassRight = null, int? FalseEvents = null);
