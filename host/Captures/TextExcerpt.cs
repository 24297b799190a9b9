using System.Globalization;
using System.Text;

namespace FreqReadout.Host.Captures;

/// <summary>
/// A bad value quoted in an error message: at most <see cref="MaxChars"/> characters of it, control and
/// other invisible characters escaped (<c>\n</c>, <c>\t</c>, <c>\u0000</c>), so a 50-million-digit tick or a
/// binary blob never floods the terminal and a line break never splits an error line.
/// </summary>
public static class TextExcerpt
{
    /// <summary>Characters of a value shown before it is cut.</summary>
    public const int MaxChars = 40;

    /// <summary>
    /// <c>'value'</c>, or for a longer value <c>'first 40 characters...' (N characters)</c>; escaped either way.
    /// </summary>
    public static string Quote(ReadOnlySpan<char> text, int maxChars = MaxChars)
    {
        int shown = Math.Min(text.Length, maxChars);
        if (shown < text.Length && shown > 0 && char.IsHighSurrogate(text[shown - 1]))
        {
            shown--; // never cut a surrogate pair in half
        }

        var sb = new StringBuilder(shown + 24);
        sb.Append('\'');
        AppendEscaped(sb, text.Slice(0, shown));
        if (shown < text.Length)
        {
            sb.Append("...' (").Append(text.Length.ToString(CultureInfo.InvariantCulture)).Append(" characters)");
        }
        else
        {
            sb.Append('\'');
        }

        return sb.ToString();
    }

    /// <summary>The same excerpt without the quotes (for text already set apart, such as a column name).</summary>
    public static string Plain(ReadOnlySpan<char> text, int maxChars = MaxChars)
    {
        string quoted = Quote(text, maxChars);
        int close = quoted.LastIndexOf('\'');
        return quoted.Substring(1, close - 1) + quoted.Substring(close + 1);
    }

    private static void AppendEscaped(StringBuilder sb, ReadOnlySpan<char> text)
    {
        for (int i = 0; i < text.Length; i++)
        {
            char c = text[i];
            switch (c)
            {
                case '\n':
                    sb.Append("\\n");
                    break;
                case '\r':
                    sb.Append("\\r");
                    break;
                case '\t':
                    sb.Append("\\t");
                    break;
                case '\\':
                    sb.Append("\\\\");
                    break;
                default:
                    bool pair = char.IsHighSurrogate(c) && i + 1 < text.Length && char.IsLowSurrogate(text[i + 1]);
                    if (pair)
                    {
                        sb.Append(c).Append(text[i + 1]);
                        i++;
                    }
                    else if (char.IsControl(c) || char.IsSurrogate(c) || c == '\uFFFD' || IsInvisible(c))
                    {
                        sb.Append("\\u").Append(((int)c).ToString("X4", CultureInfo.InvariantCulture));
                    }
                    else
                    {
                        sb.Append(c);
                    }

                    break;
            }
        }
    }

    /// <summary>Format characters that change how a line displays (bidirectional controls, zero-width marks, BOM).</summary>
    private static bool IsInvisible(char c) =>
        CharUnicodeInfo.GetUnicodeCategory(c) is UnicodeCategory.Format or UnicodeCategory.LineSeparator or UnicodeCategory.ParagraphSeparator;
}
