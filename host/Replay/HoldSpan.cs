using System.Globalization;

namespace FreqReadout.Host.Replay;

/// <summary>
/// A stretch of a replay in hold mode, given on the command line (<c>replay --hold-span FROM:TO</c>)
/// instead of <c>hold</c> / <c>release</c> marks in the capture. Times in seconds from the capture's
/// first accepted edge (time 0 of every report). Hold switches on at the end of the first gate that
/// ends at or after <see cref="FromSeconds"/> and off at the end of the first gate that ends at or
/// after <see cref="ToSeconds"/>, acting from the next gate: exactly what a <c>hold</c> mark on the
/// first row at or after FROM and a <c>release</c> mark on the first row at or after TO would do.
/// </summary>
/// <param name="FromSeconds">Start, s (finite, &gt;= 0).</param>
/// <param name="ToSeconds">End, s (finite, &gt; <paramref name="FromSeconds"/>).</param>
public readonly record struct HoldSpan(double FromSeconds, double ToSeconds)
{
    /// <summary>
    /// Parses "FROM:TO" (two numbers with '.' as decimal separator, 0 &lt;= FROM &lt; TO, both finite).
    /// False with the problem (what was expected and what was found) otherwise.
    /// </summary>
    public static bool TryParse(string text, out HoldSpan span, out string? problem)
    {
        span = default;
        problem = null;
        string[] parts = text.Split(':');
        if (parts.Length != 2
            || !double.TryParse(parts[0].Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out double from)
            || !double.TryParse(parts[1].Trim(), NumberStyles.Float, CultureInfo.InvariantCulture, out double to))
        {
            problem = $"expected FROM:TO, two times in seconds with '.' as decimal separator (as in 12.5:20), got '{Shorten(text)}'";
            return false;
        }

        if (!double.IsFinite(from) || !double.IsFinite(to))
        {
            problem = $"FROM and TO must be finite numbers of seconds, got '{Shorten(text)}'";
            return false;
        }

        if (from < 0)
        {
            problem = $"FROM must be >= 0 s (time 0 is the capture's first edge), got '{Shorten(text)}'";
            return false;
        }

        if (!(to > from))
        {
            problem = $"TO must be later than FROM, got '{Shorten(text)}'";
            return false;
        }

        span = new HoldSpan(from, to);
        return true;
    }

    /// <summary>
    /// Parses every span and sorts them by start; false with the problem when one is malformed or two
    /// overlap or touch (they would switch hold off inside the other: give them as one span).
    /// </summary>
    public static bool TryParseAll(IReadOnlyList<string> texts, out IReadOnlyList<HoldSpan> spans, out string? problem)
    {
        var list = new List<HoldSpan>();
        spans = list;
        foreach (string text in texts)
        {
            if (!TryParse(text, out HoldSpan span, out problem))
            {
                return false;
            }

            list.Add(span);
        }

        list.Sort((a, b) => a.FromSeconds.CompareTo(b.FromSeconds));
        for (int i = 1; i < list.Count; i++)
        {
            if (list[i].FromSeconds <= list[i - 1].ToSeconds)
            {
                problem = $"the spans {list[i - 1]} and {list[i]} overlap or touch; give them as one span {new HoldSpan(list[i - 1].FromSeconds, Math.Max(list[i - 1].ToSeconds, list[i].ToSeconds))}";
                return false;
            }
        }

        problem = null;
        return true;
    }

    /// <summary>"FROM:TO" in invariant numbers, as the option takes it.</summary>
    public override string ToString() => string.Create(CultureInfo.InvariantCulture, $"{FromSeconds:R}:{ToSeconds:R}");

    private static string Shorten(string text) => text.Length <= 40 ? text : text[..37] + "...";
}
