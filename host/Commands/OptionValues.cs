using System.Globalization;

namespace FreqReadout.Host.Commands;

/// <summary>Parses option values the same way everywhere: '.' as decimal separator whatever the culture.</summary>
public static class OptionValues
{
    /// <summary>A finite number in invariant form (e.g. 0.25, 1e-3); false for anything else.</summary>
    public static bool TryNumber(string text, out double value)
    {
        if (double.TryParse(text, NumberStyles.Float, CultureInfo.InvariantCulture, out value) && double.IsFinite(value))
        {
            return true;
        }

        value = 0;
        return false;
    }

    /// <summary>A value the user typed, quoted for an error message: a short, escaped excerpt (see <see cref="FreqReadout.Host.Captures.TextExcerpt"/>).</summary>
    public static string Quote(string? text) => FreqReadout.Host.Captures.TextExcerpt.Quote(text ?? string.Empty);
}
