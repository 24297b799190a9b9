using System.Globalization;
using FreqReadout.Settings;
using FsCheck;
using FsCheck.Fluent;
using FsCheck.Xunit;

namespace FreqReadout.Tests.Settings;

/// <summary>
/// The settings numbers: read and written by integer arithmetic on digits. Oracles: System.Decimal (exact decimal
/// arithmetic) for the text, and .NET's double.Parse in the invariant culture (correctly rounded since .NET Core 3.0, from memory)
/// for the value; both are run with a comma-decimal current culture to show the settings code does not depend on it.
/// </summary>
public sealed class SettingsDecimalTests
{
    [Theory]
    [InlineData(0L, 0, "0")]
    [InlineData(0L, 6, "0")]
    [InlineData(1L, 6, "0.000001")]
    [InlineData(100000L, 6, "0.1")]
    [InlineData(86400000000L, 6, "86400")]
    [InlineData(86399999999L, 6, "86399.999999")]
    [InlineData(-25L, 1, "-2.5")]
    [InlineData(-99999L, 2, "-999.99")]
    [InlineData(-100L, 2, "-1")]
    [InlineData(1000L, 0, "1000")]
    [InlineData(-7L, 0, "-7")]
    [InlineData(105L, 2, "1.05")]
    [InlineData(1000000000000000L, 2, "10000000000000")]
    public void Scaled_integers_are_written_without_trailing_zeros(long scaled, int decimals, string expected)
    {
        Assert.Equal(expected, SettingsDecimal.FormatScaled(scaled, decimals));
    }

    [Theory]
    [InlineData("0", 6, 0L)]
    [InlineData("-0", 2, 0L)]
    [InlineData("0.1", 6, 100000L)]
    [InlineData("000.100000000", 6, 100000L)] // leading zeros, and zeros past the places
    [InlineData("-2.5", 1, -25L)]
    [InlineData("5.0", 0, 5L)]
    [InlineData("86400", 6, 86400000000L)]
    [InlineData("1000000000000000", 0, 1000000000000000L)]
    public void Numbers_in_the_grammar_are_read(string text, int decimals, long expected)
    {
        Assert.True(SettingsDecimal.TryParseScaled(text, decimals, out long scaled));
        Assert.Equal(expected, scaled);
    }

    [Theory]
    [InlineData("", 2)]
    [InlineData("-", 2)]
    [InlineData(".5", 2)]
    [InlineData("5.", 2)]
    [InlineData("+5", 2)]
    [InlineData("1e3", 2)]
    [InlineData("1,5", 2)]   // a comma is never a decimal point
    [InlineData("1 000", 2)]
    [InlineData(" 5", 2)]    // the parser trims; the number itself has no spaces
    [InlineData("0.001", 2)] // more places than the key has, not zeros
    [InlineData("1.2.3", 2)]
    [InlineData("--1", 2)]
    [InlineData("NaN", 2)]
    [InlineData("Infinity", 2)]
    [InlineData("1000000000000001", 0)] // beyond MaxScaled
    [InlineData("10000000000000.01", 2)]
    [InlineData("99999999999999999999999999", 0)]
    [InlineData("\u0661", 0)] // ARABIC-INDIC DIGIT ONE is not an ASCII digit
    public void Anything_else_is_refused(string text, int decimals)
    {
        Assert.False(SettingsDecimal.TryParseScaled(text, decimals, out long scaled));
        Assert.Equal(0L, scaled);
    }

    [Fact]
    public void Rounding_to_the_steps_goes_half_away_from_zero_and_refuses_what_it_cannot_hold()
    {
        Assert.True(SettingsDecimal.TryToScaled(0.125, 2, out long up));
        Assert.Equal(13L, up);   // 0.125 is exact in binary: a true half
        Assert.True(SettingsDecimal.TryToScaled(-0.125, 2, out long down));
        Assert.Equal(-13L, down);
        Assert.True(SettingsDecimal.TryToScaled(0.1234564, 6, out long near));
        Assert.Equal(123456L, near);
        Assert.False(SettingsDecimal.TryToScaled(double.NaN, 2, out _));
        Assert.False(SettingsDecimal.TryToScaled(double.PositiveInfinity, 2, out _));
        Assert.False(SettingsDecimal.TryToScaled(1e14, 2, out _));
        Assert.True(SettingsDecimal.IsOnGrid(0.1, 6));
        Assert.False(SettingsDecimal.IsOnGrid(0.1 + 0.2, 6)); // 0.30000000000000004 is not 3/10
        Assert.False(SettingsDecimal.IsOnGrid(1e-7, 6));
    }

    private static Gen<(long Scaled, int Decimals)> ScaledGen() =>
        from decimals in Gen.Choose(0, SettingsDecimal.MaxDecimals)
        from hi in Gen.Choose(0, 999_999)
        from lo in Gen.Choose(0, 999_999_999)
        from digits in Gen.Choose(1, 15)
        from negative in Gen.Elements(false, true)
        let magnitude = ((hi * 1_000_000_000L) + lo) % Pow10(digits)
        select (negative ? -magnitude : magnitude, decimals);

    private static long Pow10(int n)
    {
        long p = 1;
        for (int i = 0; i < n; i++)
        {
            p *= 10;
        }

        return p;
    }

    private static string DecimalOracleText(long scaled, int decimals)
    {
        decimal d = scaled / (decimal)Pow10(decimals);
        string s = d.ToString(CultureInfo.InvariantCulture);
        if (s.Contains('.'))
        {
            s = s.TrimEnd('0').TrimEnd('.');
        }

        return s == "-0" ? "0" : s;
    }

    // Text written = System.Decimal's text; read back = the same integer; value = double.Parse of the text
    // (invariant culture). Run with a de-DE-like comma culture as the current culture.
    [Property(MaxTest = 2000)]
    public Property Numbers_round_trip_and_match_exact_decimal_arithmetic_in_a_comma_culture() =>
        Prop.ForAll(ScaledGen().ToArbitrary(), c => CommaCulture.Run(() =>
        {
            Assert.Equal("\u22121,5", (-1.5).ToString(CultureInfo.CurrentCulture)); // the culture is in force
            string text = SettingsDecimal.FormatScaled(c.Scaled, c.Decimals);
            bool read = SettingsDecimal.TryParseScaled(text, c.Decimals, out long back);
            double value = SettingsDecimal.ToValue(c.Scaled, c.Decimals);
            bool sameValue = value == double.Parse(text, NumberStyles.Float, CultureInfo.InvariantCulture);
            bool exactBack = SettingsDecimal.TryToScaled(value, c.Decimals, out long again) && again == c.Scaled;
            return (text == DecimalOracleText(c.Scaled, c.Decimals) && read && back == c.Scaled && sameValue && exactBack)
                .Label($"m={c.Scaled} d={c.Decimals} text={text} oracle={DecimalOracleText(c.Scaled, c.Decimals)} back={back}");
        }));
}
