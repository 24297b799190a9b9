using System.Globalization;
using FreqReadout.Detection;
using FreqReadout.Firmware.Device;
using FreqReadout.Readout;
using Xunit;

namespace FreqReadout.Firmware.Tests;

/// <summary>
/// The display lines for 16- and 20-column character LCDs: exactly the width, padded, ASCII the HD44780 shows; numbers in
/// fixed fields with sign, unit, decimals by magnitude and an overflow mark instead of a cut number; every state and
/// warning fits 16 columns; the same text in any culture. Expected lines are written out in full (values invented).
/// </summary>
public class DisplayTextTests
{
    private static Reading Make(
        ReadoutState state = ReadoutState.Tracking,
        bool hasFrequency = true,
        double frequencyHz = 130_012.4,
        bool hasShift = true,
        double shiftHz = 12.35,
        bool hasPpm = true,
        double shiftPpm = 95.3,
        bool targetPresent = false,
        bool holdActive = false,
        bool belowBeatFloor = false,
        TargetClass targetClass = TargetClass.None,
        bool disturbed = false)
    {
        var r = new Reading();
        r.Set(state, 10, 0.1, hasFrequency, frequencyHz, hasShift, 130_000, shiftHz, hasPpm, shiftPpm, 1, 0.01, 0, 0,
            targetPresent, holdActive, belowBeatFloor, targetClass, disturbed);
        return r;
    }

    private static string[] Lines(Reading r, int width) =>
        [DisplayText.FrequencyLine(r, width), DisplayText.ShiftLine(r, width), DisplayText.StatusLine(r, width), DisplayText.HealthLine(1000, 3, 12, 45_000, width)];

    // Line 1: frequency.

    [Theory]
    [InlineData(130_012.4, "F   130012.4 Hz")]
    [InlineData(12_500.04, "F    12500.0 Hz")]
    [InlineData(45.26, "F       45.3 Hz")]
    [InlineData(0.04, "F        0.0 Hz")]
    [InlineData(999_999.94, "F   999999.9 Hz")]   // 7 significant digits: one place below 1 MHz
    [InlineData(999_999.96, "F    1000000 Hz")]   // rounds up into the 7th whole digit: no place
    [InlineData(1_234_567.4, "F    1234567 Hz")]
    [InlineData(9_999_999_999.4, "F 9999999999 Hz")] // the field's 10 digits
    [InlineData(9_999_999_999.6, "F        OVR Hz")] // rounds to 11 digits: overflow, not a cut number
    [InlineData(1e300, "F        OVR Hz")]
    [InlineData(double.PositiveInfinity, "F        OVR Hz")]
    [InlineData(double.NaN, "F        --- Hz")]
    public void Frequency_line_has_a_fixed_field_with_decimals_by_magnitude_and_an_overflow_mark(double hz, string expected)
    {
        Reading r = Make(frequencyHz: hz);
        Assert.Equal(expected.PadRight(16), DisplayText.FrequencyLine(r, 16));
        Assert.Equal(expected.PadRight(20), DisplayText.FrequencyLine(r, 20));
    }

    [Fact]
    public void Frequency_line_without_a_signal_shows_dashes_in_the_field_and_keeps_the_unit()
    {
        Reading r = Make(state: ReadoutState.NoSignal, hasFrequency: false, frequencyHz: 0, hasShift: false);
        Assert.Equal("F        --- Hz ", DisplayText.FrequencyLine(r, 16));
        Assert.Equal("F        --- Hz     ", DisplayText.FrequencyLine(r, 20));
    }

    // Line 2: shift.

    [Theory]
    [InlineData(12.35, 95.3, " +12.35 Hz +95.3 ppm", "+12.35Hz  +95ppm")]
    [InlineData(-12.35, -95.3, " -12.35 Hz -95.3 ppm", "-12.35Hz  -95ppm")]
    [InlineData(0.0, 0.0, "   0.00 Hz  0.00 ppm", "  0.00Hz 0.00ppm")]
    [InlineData(-0.004, -0.004, "   0.00 Hz  0.00 ppm", "  0.00Hz 0.00ppm")] // rounds to zero: no sign
    [InlineData(0.006, 0.006, "  +0.01 Hz +0.01 ppm", " +0.01Hz  0.0ppm")]
    [InlineData(3.14159, 2.71828, "  +3.14 Hz +2.72 ppm", " +3.14Hz +2.7ppm")]
    [InlineData(999.994, 9.994, "+999.99 Hz +9.99 ppm", " +1000Hz  +10ppm")]   // 999.994 to one place is 1000.0
    [InlineData(999.996, 9.996, "+1000.0 Hz +10.0 ppm", " +1000Hz  +10ppm")] // carry: one place fewer
    [InlineData(-1234.56, -123.4, "-1234.6 Hz  -123 ppm", " -1235Hz -123ppm")]
    [InlineData(99_999.4, 9_999.4, " +99999 Hz +9999 ppm", "+99999Hz +OVRppm")]
    [InlineData(999_999.4, 9_999.6, "+999999 Hz  +OVR ppm", "  +OVRHz +OVRppm")]
    [InlineData(1e6, 1e4, "   +OVR Hz  +OVR ppm", "  +OVRHz +OVRppm")]
    [InlineData(-1e6, -1e4, "   -OVR Hz  -OVR ppm", "  -OVRHz -OVRppm")]
    [InlineData(double.NegativeInfinity, double.NaN, "   -OVR Hz   --- ppm", "  -OVRHz  ---ppm")]
    public void Shift_line_has_signed_fixed_fields_in_Hz_and_ppm(double hz, double ppm, string wide, string narrow)
    {
        Reading r = Make(shiftHz: hz, shiftPpm: ppm);
        Assert.Equal(wide.PadRight(20), DisplayText.ShiftLine(r, 20));
        Assert.Equal(narrow.PadRight(16), DisplayText.ShiftLine(r, 16));
    }

    [Fact]
    public void Shift_line_without_a_ppm_reference_shows_Hz_only()
    {
        Reading r = Make(shiftHz: -0.42, hasPpm: false);
        Assert.Equal("  -0.42 Hz          ", DisplayText.ShiftLine(r, 20));
        Assert.Equal(" -0.42Hz         ", DisplayText.ShiftLine(r, 17)); // 17-19 columns use the narrow layout
        Assert.Equal(" -0.42Hz        ", DisplayText.ShiftLine(r, 16));
    }

    [Fact]
    public void Shift_line_says_why_there_is_no_shift()
    {
        Reading none = Make(state: ReadoutState.NoSignal, hasFrequency: false, hasShift: false);
        Reading settling = Make(state: ReadoutState.Settling, hasShift: false);
        Assert.Equal("check input     ", DisplayText.ShiftLine(none, 16));
        Assert.Equal("taking baseline ", DisplayText.ShiftLine(settling, 16));
        Assert.Equal("taking baseline     ", DisplayText.ShiftLine(settling, 20));
    }

    // Line 3: status.

    [Theory]
    [InlineData(ReadoutState.NoSignal, false, TargetClass.None, "NO SIGNAL")]
    [InlineData(ReadoutState.Settling, false, TargetClass.None, "SETTLING")]
    [InlineData(ReadoutState.Tracking, false, TargetClass.None, "TRACKING")]
    [InlineData(ReadoutState.Target, true, TargetClass.Ferrous, "FERROUS")]
    [InlineData(ReadoutState.Target, true, TargetClass.NonFerrous, "NON-FERROUS")]
    [InlineData(ReadoutState.Target, true, TargetClass.Unclear, "UNCLEAR")]
    [InlineData(ReadoutState.Target, true, TargetClass.None, "TARGET")]
    public void Status_line_names_the_state_or_the_class_of_a_present_target(ReadoutState state, bool target, TargetClass c, string expected)
    {
        Reading r = Make(state: state, targetPresent: target, targetClass: c, hasShift: state >= ReadoutState.Tracking);
        Assert.Equal(expected.PadRight(16), DisplayText.StatusLine(r, 16));
        Assert.Equal(expected.PadRight(20), DisplayText.StatusLine(r, 20));
    }

    [Fact]
    public void Hold_is_the_state_without_a_target_and_a_warning_beside_a_target()
    {
        Assert.Equal("HOLD            ", DisplayText.StatusLine(Make(state: ReadoutState.Hold, holdActive: true), 16));
        Reading held = Make(state: ReadoutState.Hold, holdActive: true, targetPresent: true, targetClass: TargetClass.NonFerrous);
        Assert.Equal("NON-FERROUS HOLD", DisplayText.StatusLine(held, 16));
        Assert.Equal("NON-FERROUS HOLD    ", DisplayText.StatusLine(held, 20));
    }

    [Fact]
    public void A_disturbed_baseline_is_shown_while_recapturing_and_while_tracking_on_the_kept_one()
    {
        Reading recapturing = Make(state: ReadoutState.Settling, hasShift: false, disturbed: true);
        Reading kept = Make(disturbed: true);
        Assert.Equal("SETTLING BASE MOVED ", DisplayText.StatusLine(recapturing, 20));
        Assert.Equal("SETTLE BM!      ", DisplayText.StatusLine(recapturing, 16));
        Assert.Equal("TRACKING BASE MOVED ", DisplayText.StatusLine(kept, 20));
        Assert.Equal("TRACK BASE MOVED", DisplayText.StatusLine(kept, 16));
        Assert.Equal("TRACKING            ", DisplayText.StatusLine(Make(), 20));
        Assert.Equal("TRACKING BASELINE MOVED", DisplayText.StatusLine(kept, 23));
    }

    [Fact]
    public void Near_zero_beat_is_warned_in_words_that_fit_the_width()
    {
        Reading tracking = Make(belowBeatFloor: true);
        Assert.Equal("TRACKING ZERO BEAT  ", DisplayText.StatusLine(tracking, 20));
        Assert.Equal("TRACK ZERO BEAT ", DisplayText.StatusLine(tracking, 16));
        Assert.Equal("TRACKING NEAR ZERO BEAT", DisplayText.StatusLine(tracking, 23));

        Reading target = Make(state: ReadoutState.Target, targetPresent: true, targetClass: TargetClass.Unclear, belowBeatFloor: true);
        Assert.Equal("UNCLEAR ZERO BEAT   ", DisplayText.StatusLine(target, 20));
        Assert.Equal("UNCLR ZERO BEAT ", DisplayText.StatusLine(target, 16));

        Assert.DoesNotContain("BEAT", DisplayText.StatusLine(Make(), 20));
    }

    [Fact]
    public void Every_warning_at_once_still_fits_16_columns_as_tags()
    {
        Reading worst = Make(state: ReadoutState.Hold, targetPresent: true, targetClass: TargetClass.NonFerrous,
            holdActive: true, belowBeatFloor: true, disturbed: true);
        Assert.Equal("NON-FE ZB! BM! H", DisplayText.StatusLine(worst, 16));
        Assert.Equal("NON-FE ZB! BM! H    ", DisplayText.StatusLine(worst, 20));
        Assert.Equal("NON-FE ZERO BEAT BASE MOVED HOLD", DisplayText.StatusLine(worst, 32));
        Assert.Equal("NON-FERROUS NEAR ZERO BEAT BASELINE MOVED HOLD", DisplayText.StatusLine(worst, 46));

        Reading settling = Make(state: ReadoutState.Settling, hasShift: false, holdActive: true, belowBeatFloor: true, disturbed: true);
        Assert.Equal("SETTLE ZB! BM! H", DisplayText.StatusLine(settling, 16));
    }

    // Line 4: health.

    [Fact]
    public void Health_line_shows_reads_a_second_stalls_missed_deadlines_and_on_20_columns_the_longest_gap()
    {
        Assert.Equal("1000/s S  3 M 12", DisplayText.HealthLine(1000, 3, 12, 45_000, 16));
        Assert.Equal("1000/s S 3 M12  45ms", DisplayText.HealthLine(1000, 3, 12, 45_000, 20));
        Assert.Equal("   0/s S  0 M  0", DisplayText.HealthLine(0, 0, 0, 0, 16));
        Assert.Equal("   0/s S 0 M 0   0ms", DisplayText.HealthLine(0, 0, 0, 0, 20));
    }

    [Fact]
    public void Health_counts_too_large_for_their_fields_show_nines_and_a_plus_and_the_gap_rounds_to_ms()
    {
        Assert.Equal("9999/s S999 M999", DisplayText.HealthLine(9999, 999, 999, 0, 16));
        Assert.Equal("999+/s S99+ M99+", DisplayText.HealthLine(10_000, 1000, 123_456, 0, 16));
        Assert.Equal("999+/s S9+ M9+ 99+ms", DisplayText.HealthLine(10_000, 100, 100, 1_000_000, 20));
        Assert.Equal("1000/s S 3 M12  44ms", DisplayText.HealthLine(1000, 3, 12, 44_499, 20));
        Assert.Equal("1000/s S 3 M12  45ms", DisplayText.HealthLine(1000, 3, 12, 44_500, 20));
        Assert.Equal("1000/s S 3 M12 999ms", DisplayText.HealthLine(1000, 3, 12, 999_499, 20));
        Assert.Equal("   ?/s S  ? M  ?", DisplayText.HealthLine(-1, -1, -1, 0, 16));
        Assert.Equal("999+/s S9+ M9+ 99+ms", DisplayText.HealthLine(long.MaxValue, long.MaxValue, long.MaxValue, long.MaxValue, 20));
        Assert.Equal("   ?/s S ? M ?   ?ms", DisplayText.HealthLine(long.MinValue, -1, -1, -1, 20));
    }

    // Widths, padding, character set, culture.

    [Fact]
    public void Lines_are_padded_so_a_shorter_line_overwrites_every_character_of_a_longer_one()
    {
        Reading wide = Make(state: ReadoutState.Target, targetPresent: true, targetClass: TargetClass.NonFerrous, disturbed: true);
        Reading narrow = Make(state: ReadoutState.Hold, holdActive: true, hasPpm: false);
        foreach (int width in new[] { 16, 20 })
        {
            string before = DisplayText.StatusLine(wide, width);
            string after = DisplayText.StatusLine(narrow, width);
            Assert.Equal(width, before.Length);
            Assert.Equal(width, after.Length);
            Assert.StartsWith("HOLD", after);
            Assert.Equal(new string(' ', width - 4), after[4..]);
            Assert.EndsWith("      ", DisplayText.ShiftLine(narrow, width));
        }
    }

    [Theory]
    [InlineData(20, 4)]
    [InlineData(16, 2)]
    public void Through_the_LCD_encoder_the_display_shows_each_line_exactly_even_after_a_longer_one(int columns, int rows)
    {
        var encoder = new FreqReadout.Firmware.Board.Hd44780Pcf8574Encoder(columns, rows);
        var model = new Hd44780Model();
        foreach (int nibble in new[] { 0x30, 0x30, 0x30, 0x20 })
        {
            model.Feed(encoder.Buffer, encoder.EncodeInitNibble(nibble));
        }

        foreach (int instruction in new[] { 0x28, 0x08, 0x01, 0x06, 0x0C })
        {
            model.Feed(encoder.Buffer, encoder.EncodeInstruction(instruction));
        }

        encoder.ClearedAll();
        Reading[] sequence =
        [
            Make(state: ReadoutState.Target, targetPresent: true, targetClass: TargetClass.NonFerrous, shiftHz: -1234.56, shiftPpm: -123.4, holdActive: true, belowBeatFloor: true, disturbed: true),
            Make(state: ReadoutState.Hold, holdActive: true, hasPpm: false, shiftHz: 0.5),
            Make(state: ReadoutState.NoSignal, hasFrequency: false, hasShift: false),
        ];
        int rowOfStatus = rows >= 4 ? 2 : 1;
        int statusAddress = rowOfStatus == 2 ? columns : 0x40;   // 2-line DDRAM map: row 3 follows row 1, row 2 at 0x40
        foreach (Reading r in sequence)
        {
            string shift = DisplayText.ShiftLine(r, columns);
            string status = DisplayText.StatusLine(r, columns);
            int row = rowOfStatus - 1;
            model.Feed(encoder.Buffer, encoder.EncodeRow(row, shift));
            encoder.Sent(shift);
            model.Feed(encoder.Buffer, encoder.EncodeRow(rowOfStatus, status));
            encoder.Sent(status);
            Assert.Equal(shift, model.Text(row == 1 ? 0x40 : 0x00, columns));
            Assert.Equal(status, model.Text(statusAddress, columns));
        }

        Assert.Equal("check input".PadRight(columns), model.Text(rows >= 4 ? 0x40 : 0x00, columns));
        Assert.Empty(model.Violations);
    }

    [Fact]
    public void Widths_below_the_narrow_layout_are_cut_and_zero_gives_empty_lines()
    {
        Reading r = Make();
        Assert.Equal("F   130012.", DisplayText.FrequencyLine(r, 11));
        Assert.Equal(string.Empty, DisplayText.StatusLine(r, 0));
        Assert.Equal(string.Empty, DisplayText.HealthLine(1, 1, 1, 1, -3));
    }

    [Fact]
    public void Lines_are_the_same_in_a_culture_with_a_decimal_comma_and_an_odd_minus_sign()
    {
        Reading[] readings =
        [
            Make(),
            Make(frequencyHz: 1_234.56, shiftHz: -0.75, shiftPpm: -3.25),
            Make(frequencyHz: 12.3456, shiftHz: -98_765.4, shiftPpm: -0.001),
            Make(state: ReadoutState.Target, targetPresent: true, targetClass: TargetClass.Ferrous, shiftHz: -1e7, belowBeatFloor: true),
        ];
        var expected = readings.Select(r => string.Join("|", Lines(r, 20)) + "/" + string.Join("|", Lines(r, 16))).ToArray();
        Assert.DoesNotContain(',', string.Join("", expected));

        CultureInfo saved = CultureInfo.CurrentCulture;
        try
        {
            // Built by hand: the test process may run in invariant globalization mode.
            var comma = (CultureInfo)CultureInfo.InvariantCulture.Clone();
            comma.NumberFormat.NumberDecimalSeparator = ",";
            comma.NumberFormat.NumberGroupSeparator = ".";
            comma.NumberFormat.NegativeSign = "\u2212";
            comma.NumberFormat.PositiveSign = "p";
            CultureInfo.CurrentCulture = comma;
            Assert.Equal("0,5", 0.5.ToString(CultureInfo.CurrentCulture)); // the culture is in force

            var actual = readings.Select(r => string.Join("|", Lines(r, 20)) + "/" + string.Join("|", Lines(r, 16))).ToArray();
            Assert.Equal(expected, actual);
        }
        finally
        {
            CultureInfo.CurrentCulture = saved;
        }
    }

    /// <summary>
    /// Hitachi HD44780U (LCD-II) data sheet, Table 4 "Correspondence between character codes and character patterns",
    /// ROM code A00 (from memory): codes 0x20-0x7D are the ASCII characters except 0x5C, which is a yen sign; 0x7E and
    /// 0x7F are right and left arrows; codes above 0x7F are Japanese kana and symbols. So a line must stay within
    /// 0x20-0x7D and avoid '\'.
    /// </summary>
    private static bool ShowsAsAscii(char c) => c >= 0x20 && c <= 0x7D && c != '\\';

    [Fact]
    public void Random_readings_give_lines_of_exactly_the_width_in_characters_the_HD44780_shows_as_ASCII()
    {
        var rng = new Random(20261203);
        int[] widths = [16, 17, 18, 19, 20, 24, 40];
        for (int i = 0; i < 20_000; i++)
        {
            Reading r = Make(
                state: (ReadoutState)rng.Next(5),
                hasFrequency: rng.Next(8) != 0,
                frequencyHz: RandomValue(rng, false),
                hasShift: rng.Next(8) != 0,
                shiftHz: RandomValue(rng, true),
                hasPpm: rng.Next(3) != 0,
                shiftPpm: RandomValue(rng, true),
                targetPresent: rng.Next(2) == 0,
                holdActive: rng.Next(3) == 0,
                belowBeatFloor: rng.Next(4) == 0,
                targetClass: (TargetClass)rng.Next(4),
                disturbed: rng.Next(4) == 0);
            long[] counts = [RandomCount(rng), RandomCount(rng), RandomCount(rng), RandomCount(rng)];
            foreach (int width in widths)
            {
                string[] lines =
                [
                    DisplayText.FrequencyLine(r, width), DisplayText.ShiftLine(r, width), DisplayText.StatusLine(r, width),
                    DisplayText.HealthLine(counts[0], counts[1], counts[2], counts[3], width),
                ];
                foreach (string line in lines)
                {
                    Assert.True(line.Length == width, $"width {width}: \"{line}\" ({line.Length})");
                    Assert.True(line.All(ShowsAsAscii), $"not shown as ASCII by an HD44780: \"{line}\"");
                }
            }
        }
    }

    [Fact]
    public void A_number_field_shows_the_value_to_half_its_last_place_or_the_overflow_mark_only_when_the_digits_do_not_fit()
    {
        var rng = new Random(11);
        for (int i = 0; i < 50_000; i++)
        {
            double value = RandomValue(rng, true);
            if (!double.IsFinite(value))
            {
                continue;
            }

            bool signed = rng.Next(2) == 0;
            int fieldWidth = 4 + rng.Next(8);
            int maxDecimals = rng.Next(4);
            int significant = 1 + rng.Next(8);
            string field = DisplayNumber.Measured(value, signed, fieldWidth, maxDecimals, significant);
            Assert.Equal(fieldWidth, field.Length);
            string text = field.Trim();
            double whole = Math.Round(Math.Abs(value), MidpointRounding.AwayFromZero);
            int minimal = (value < 0 && whole != 0 ? 1 : 0) + (signed && value > 0 && whole != 0 ? 1 : 0) + whole.ToString("F0", CultureInfo.InvariantCulture).Length;
            bool overflow = text.EndsWith(DisplayNumber.OverflowMark, StringComparison.Ordinal);
            Assert.True(overflow == (minimal > fieldWidth), $"{value:R} in {fieldWidth}: \"{text}\", sign and whole digits {minimal}");
            if (overflow)
            {
                Assert.Equal(value < 0 ? "-OVR" : (signed ? "+OVR" : "OVR"), text);
                continue;
            }

            double shown = double.Parse(text, NumberStyles.Float, CultureInfo.InvariantCulture);
            int point = text.IndexOf('.');
            int places = point < 0 ? 0 : text.Length - point - 1;
            Assert.True(places <= maxDecimals, $"{value:R}: {places} places > {maxDecimals}");
            double halfPlace = 0.5 * Math.Pow(10, -places);
            Assert.True(Math.Abs(shown - value) <= halfPlace * (1 + 1e-9) + (Math.Abs(value) * 1e-15), $"{value:R} shown as \"{text}\"");
            Assert.True(text[0] != '+' || (signed && value > 0), $"{value:R}: \"{text}\"");
            Assert.True(text[0] != '-' || value < 0, $"{value:R}: \"{text}\"");
            Assert.True(shown != 0 || char.IsDigit(text[0]), $"{value:R}: zero with a sign \"{text}\"");
        }
    }

    private static double RandomValue(Random rng, bool signed)
    {
        switch (rng.Next(20))
        {
            case 0: return double.NaN;
            case 1: return signed && rng.Next(2) == 0 ? double.NegativeInfinity : double.PositiveInfinity;
            case 2: return 0;
            case 3: return signed ? -Math.Pow(10, rng.Next(-3, 13)) : Math.Pow(10, rng.Next(-3, 13)); // exact powers: boundaries
            case 4: return (signed && rng.Next(2) == 0 ? -1 : 1) * (Math.Pow(10, rng.Next(0, 12)) - (0.5 * Math.Pow(10, -rng.Next(0, 4)))); // ...9.5 boundaries
            default:
                double magnitude = Math.Pow(10, (rng.NextDouble() * 20) - 6);
                return signed && rng.Next(2) == 0 ? -magnitude : magnitude;
        }
    }

    private static long RandomCount(Random rng) => rng.Next(6) switch
    {
        0 => -rng.Next(1, 1000),
        1 => long.MaxValue,
        2 => 0,
        _ => (long)Math.Pow(10, rng.NextDouble() * 12),
    };
}
