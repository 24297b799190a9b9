namespace FreqReadout.Firmware.Tests;

/// <summary>
/// A model of an HD44780 controller behind a PCF8574 backpack (P0 RS, P1 R/W, P2 E, P3 backlight, P4..P7 D4..D7), fed
/// the bytes the PCF8574 would put on its pins. It starts in 8-bit mode as after power-on, latches D7..D4 on each
/// falling edge of E, switches to the 4-bit interface on a function set with DL = 0 and then joins nibbles high first,
/// and runs the instructions the adapter uses (clear, entry mode, display control, function set, set DDRAM address) and
/// character writes into a 128-byte DDRAM. It records timing-rule violations a real controller would not forgive:
/// RS or the data changing in the same byte as E's edge, and R/W high. From the HD44780U data sheet's description of
/// the 4-bit interface and instruction set, from memory; a model for the tests, not a simulator of every instruction.
/// </summary>
internal sealed class Hd44780Model
{
    private readonly byte[] ddram = new byte[128];
    private int previous;
    private int pendingHigh = -1;
    private int address;

    public bool EightBitMode { get; private set; } = true;

    public int FunctionSet { get; private set; } = -1;

    public int DisplayControl { get; private set; } = -1;

    public int EntryMode { get; private set; } = -1;

    public int Clears { get; private set; }

    public bool BacklightOn => (previous & 0x08) != 0;

    public List<string> Violations { get; } = [];

    public List<int> Instructions { get; } = [];

    public void Feed(byte[] bytes, int count)
    {
        for (int i = 0; i < count; i++)
        {
            Feed(bytes[i]);
        }
    }

    public void Feed(int value)
    {
        bool e = (value & 0x04) != 0;
        bool wasE = (previous & 0x04) != 0;
        if ((value & 0x02) != 0)
        {
            Violations.Add("R/W high in byte 0x" + value.ToString("X2"));
        }

        if (e != wasE && (value & 0x01) != (previous & 0x01))
        {
            Violations.Add("RS changed with E's " + (e ? "rising" : "falling") + " edge (byte 0x" + value.ToString("X2") + ")");
        }

        if (wasE && !e && (value & 0xF0) != (previous & 0xF0))
        {
            Violations.Add("data changed with E's falling edge (byte 0x" + value.ToString("X2") + ")");
        }

        if (wasE && !e)
        {
            Latch(previous >> 4, (previous & 0x01) != 0);
        }

        previous = value;
    }

    /// <summary>The characters of the DDRAM from <paramref name="start"/>, <paramref name="length"/> of them.</summary>
    public string Text(int start, int length)
    {
        var chars = new char[length];
        for (int i = 0; i < length; i++)
        {
            chars[i] = (char)ddram[(start + i) & 0x7F];
        }

        return new string(chars);
    }

    private void Latch(int nibble, bool registerSelect)
    {
        if (EightBitMode)
        {
            Execute(nibble << 4, registerSelect);
            return;
        }

        if (pendingHigh < 0)
        {
            pendingHigh = nibble;
            return;
        }

        int value = (pendingHigh << 4) | nibble;
        pendingHigh = -1;
        Execute(value, registerSelect);
    }

    private void Execute(int value, bool registerSelect)
    {
        if (registerSelect)
        {
            ddram[address] = (byte)value;
            address = (address + 1) & 0x7F;
            return;
        }

        Instructions.Add(value);
        if ((value & 0x80) != 0)
        {
            address = value & 0x7F;
        }
        else if ((value & 0x40) != 0)
        {
            // CGRAM address: not used by the adapter.
        }
        else if ((value & 0x20) != 0)
        {
            EightBitMode = (value & 0x10) != 0;
            FunctionSet = value;
        }
        else if ((value & 0x10) != 0)
        {
            // Cursor or display shift: not used by the adapter.
        }
        else if ((value & 0x08) != 0)
        {
            DisplayControl = value;
        }
        else if ((value & 0x04) != 0)
        {
            EntryMode = value;
        }
        else if ((value & 0x02) != 0)
        {
            address = 0; // return home
        }
        else if (value == 0x01)
        {
            Array.Fill(ddram, (byte)' ');
            address = 0;
            Clears++;
        }
    }
}
