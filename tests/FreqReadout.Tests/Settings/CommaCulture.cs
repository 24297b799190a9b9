using System.Globalization;

namespace FreqReadout.Tests.Settings;

/// <summary>
/// A culture that writes numbers as de-DE does (decimal comma, '.' between thousands), built by hand because the test
/// process runs in invariant globalization mode (CultureInfo.GetCultureInfo("de-DE") throws there); its minus sign is
/// U+2212 as in some other cultures, so a stray long.ToString() or double.Parse would show too.
/// </summary>
internal static class CommaCulture
{
    public static CultureInfo Create()
    {
        var c = (CultureInfo)CultureInfo.InvariantCulture.Clone();
        c.NumberFormat.NumberDecimalSeparator = ",";
        c.NumberFormat.NumberGroupSeparator = ".";
        c.NumberFormat.NegativeSign = "\u2212";
        return c;
    }

    /// <summary>Runs <paramref name="body"/> with the comma culture as the current culture and restores the one before.</summary>
    public static T Run<T>(Func<T> body)
    {
        CultureInfo saved = CultureInfo.CurrentCulture;
        try
        {
            CultureInfo.CurrentCulture = Create();
            return body();
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }
    }
}
