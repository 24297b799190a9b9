using FreqReadout.Firmware.Board;

namespace FreqReadout.Firmware.Tests;

/// <summary>
/// The LCD adapter's byte stream, run through a model of the HD44780 behind a PCF8574 (<see cref="Hd44780Model"/>):
/// the set-up ends in the 4-bit interface with the intended modes, rows show the text padded, cut and mapped to the
/// character set, only changed characters are sent, a lost write is sent whole next time, and no byte changes RS or
/// the data on an edge of E. Display lines are examples in DisplayText's formats (invented values).
/// </summary>
public class Hd44780Pcf8574EncoderTests
{
    private static (Hd44780Pcf8574Encoder Encoder, Hd44780Model Model) Initialised(int columns, int rows)
    {
        var encoder = new Hd44780Pcf8574Encoder(columns, rows);
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
        return (encoder, model);
    }

    private static void Show(Hd44780Pcf8574Encoder encoder, Hd44780Model model, int row, string text)
    {
        int length = encoder.EncodeRow(row, text);
        model.Feed(encoder.Buffer, length);
        encoder.Sent(text);
    }

    [Fact]
    public void Initialising_by_instruction_ends_in_the_4_bit_interface_with_two_lines_display_on_and_increment()
    {
        (_, Hd44780Model model) = Initialised(20, 4);
        Assert.False(model.EightBitMode);
        Assert.Equal(0x28, model.FunctionSet);
        Assert.Equal(0x0C, model.DisplayControl);
        Assert.Equal(0x06, model.EntryMode);
        Assert.Equal(1, model.Clears);
        Assert.Equal(new[] { 0x30, 0x30, 0x30, 0x20, 0x28, 0x08, 0x01, 0x06, 0x0C }, model.Instructions);
        Assert.True(model.BacklightOn);
        Assert.Empty(model.Violations);
    }

    [Fact]
    public void Rows_of_a_20x4_display_show_the_lines_padded_at_their_DDRAM_addresses()
    {
        (Hd44780Pcf8574Encoder encoder, Hd44780Model model) = Initialised(20, 4);
        Show(encoder, model, 0, "F 130012.4 Hz");
        Show(encoder, model, 1, "d +12.35 Hz +95 ppm");
        Show(encoder, model, 2, "NON-FERROUS");
        Show(encoder, model, 3, "r500 s0 m0 g3");

        // HD44780 20x4 modules: rows at 0x00, 0x40, 0x14, 0x54 (data sheet's 2-line DDRAM map, from memory).
        Assert.Equal("F 130012.4 Hz       ", model.Text(0x00, 20));
        Assert.Equal("d +12.35 Hz +95 ppm ", model.Text(0x40, 20));
        Assert.Equal("NON-FERROUS         ", model.Text(0x14, 20));
        Assert.Equal("r500 s0 m0 g3       ", model.Text(0x54, 20));
        Assert.Empty(model.Violations);
    }

    [Fact]
    public void Rows_three_and_four_of_a_16_column_display_start_at_0x10_and_0x50()
    {
        (Hd44780Pcf8574Encoder encoder, Hd44780Model model) = Initialised(16, 4);
        Show(encoder, model, 2, "tracking");
        Show(encoder, model, 3, "HOLD");
        Assert.Equal("tracking        ", model.Text(0x10, 16));
        Assert.Equal("HOLD            ", model.Text(0x50, 16));
    }

    [Fact]
    public void A_changed_digit_is_sent_alone_and_an_unchanged_row_not_at_all()
    {
        (Hd44780Pcf8574Encoder encoder, Hd44780Model model) = Initialised(20, 4);
        Show(encoder, model, 0, "F 130012.4 Hz");

        int length = encoder.EncodeRow(0, "F 130012.7 Hz");
        Assert.Equal(1 + 4 + 1 + 4, length); // RS low, the address instruction, RS high, one character
        model.Feed(encoder.Buffer, length);
        encoder.Sent("F 130012.7 Hz");
        Assert.Equal("F 130012.7 Hz       ", model.Text(0x00, 20));

        Assert.Equal(0, encoder.EncodeRow(0, "F 130012.7 Hz"));
        Assert.Equal(1 + 4 + 1 + (4 * 3), encoder.EncodeRow(0, "F 130013.1 Hz")); // columns 7 and 9 differ: the span of three is sent
        Assert.Empty(model.Violations);
    }

    [Fact]
    public void Long_text_is_cut_and_characters_outside_the_ROM_range_become_question_marks()
    {
        (Hd44780Pcf8574Encoder encoder, Hd44780Model model) = Initialised(16, 2);
        Show(encoder, model, 0, "d +12.35 Hz +95 ppm and more");
        Show(encoder, model, 1, "5 \u00b5s \\ ~");
        Assert.Equal("d +12.35 Hz +95 ", model.Text(0x00, 16));
        Assert.Equal("5 ?s ? ?        ", model.Text(0x40, 16));
    }

    [Fact]
    public void A_lost_write_sends_the_whole_row_next_time_and_an_unknown_display_is_rewritten_whole()
    {
        (Hd44780Pcf8574Encoder encoder, Hd44780Model model) = Initialised(20, 4);
        Show(encoder, model, 1, "settling...");
        encoder.EncodeRow(1, "settling..!");
        encoder.Lost();
        Assert.Equal(1 + 4 + 1 + (4 * 20), encoder.EncodeRow(1, "settling..!"));

        var fresh = new Hd44780Pcf8574Encoder(20, 4); // nothing known shown: every cell is sent, spaces too
        Assert.Equal(1 + 4 + 1 + (4 * 20), fresh.EncodeRow(0, string.Empty));
        fresh.ClearedAll();
        Assert.Equal(0, fresh.EncodeRow(0, null!));
    }

    [Fact]
    public void The_model_flags_RS_changing_with_E_so_its_clean_verdicts_mean_something()
    {
        var model = new Hd44780Model();
        model.Feed(0x08);        // backlight, E low, RS low
        model.Feed(0x08 | 0x04 | 0x01 | 0x30); // E rises with RS: address set-up time violated
        model.Feed(0x08 | 0x01 | 0x40); // E falls with the data changed
        Assert.Equal(2, model.Violations.Count);
    }

    [Theory]
    [InlineData(15, 2)]
    [InlineData(20, 3)]
    public void Sizes_other_than_16_or_20_by_2_or_4_are_refused(int columns, int rows)
    {
        Assert.Throws<ArgumentOutOfRangeException>(() => new Hd44780Pcf8574Encoder(columns, rows));
    }
}
