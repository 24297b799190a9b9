namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// Turns HD44780 instructions and display rows into the byte stream a PCF8574 I2C backpack puts on the LCD's pins
    /// (4-bit interface), keeping a copy of what the display holds so that a row is sent only from its first to its
    /// last changed character. Pure code over mscorlib (no nanoFramework device API), so the host tests run it against
    /// a model of the controller; <see cref="I2cCharacterLcd"/> sends each encoded buffer in one I2C write.
    /// <para>
    /// Bit mapping (the common backpack wiring, an assumption; other backpacks differ): P0 RS, P1 R/W (always low: the
    /// busy flag is never read), P2 E, P3 backlight, P4..P7 D4..D7. Each instruction or character is two nibbles, high
    /// first; a nibble is a byte with E high then the same byte with E low (the controller latches on E's falling
    /// edge). A buffer starts with a byte that sets RS with E low, and a switch from an instruction to characters inside
    /// a buffer adds one more, so RS is settled before E rises (address set-up time). HD44780U data sheet (Hitachi),
    /// 4-bit interface and "initialising by instruction", from memory.
    /// </para>
    /// <para>
    /// DDRAM rows start at 0x00, 0x40, columns and 0x40 + columns (20x4: 0x00, 0x40, 0x14, 0x54). Characters outside
    /// 0x20-0x7D, and '\' (a yen sign in the common A00 character ROM), become '?'; text beyond the row is cut, a
    /// shorter row is padded with spaces. Nothing allocates after construction.
    /// </para>
    /// </summary>
    public sealed class Hd44780Pcf8574Encoder
    {
        /// <summary>PCF8574 bit wired to the LCD's RS (register select: 0 instruction, 1 character).</summary>
        public const int RegisterSelectBit = 0x01;

        /// <summary>PCF8574 bit wired to the LCD's E (enable: data latched on its falling edge).</summary>
        public const int EnableBit = 0x04;

        /// <summary>PCF8574 bit that switches the backlight on.</summary>
        public const int BacklightBit = 0x08;

        /// <summary>HD44780 instruction "set DDRAM address" (OR the address in).</summary>
        public const int SetDdramAddress = 0x80;

        private const byte Unknown = 0;

        private readonly int columns;
        private readonly int rows;
        private readonly byte[] shown;
        private readonly byte[] buffer;
        private int pendingRow = -1;
        private int pendingFirst;
        private int pendingLast;

        /// <summary>An encoder for a display of <paramref name="columns"/> x <paramref name="rows"/> (16 or 20 by 2 or 4); nothing is known shown yet.</summary>
        public Hd44780Pcf8574Encoder(int columns, int rows)
        {
            if (columns != 16 && columns != 20)
            {
                throw new System.ArgumentOutOfRangeException("columns", "columns must be 16 or 20");
            }

            if (rows != 2 && rows != 4)
            {
                throw new System.ArgumentOutOfRangeException("rows", "rows must be 2 or 4");
            }

            this.columns = columns;
            this.rows = rows;
            shown = new byte[rows * columns];
            buffer = new byte[2 + (4 * (columns + 1))];
        }

        /// <summary>Characters per row.</summary>
        public int Columns
        {
            get { return columns; }
        }

        /// <summary>Rows.</summary>
        public int Rows
        {
            get { return rows; }
        }

        /// <summary>The encoded bytes; the length is what the last Encode call returned.</summary>
        public byte[] Buffer
        {
            get { return buffer; }
        }

        /// <summary>Encodes one nibble in the 8-bit phase of initialisation (RS low, one E pulse); returns the length.</summary>
        /// <param name="highNibble">The nibble in bits 7..4 (0x30 or 0x20 during initialisation).</param>
        public int EncodeInitNibble(int highNibble)
        {
            int nibble = highNibble & 0xF0;
            buffer[0] = (byte)(nibble | BacklightBit);
            buffer[1] = (byte)(nibble | BacklightBit | EnableBit);
            buffer[2] = (byte)(nibble | BacklightBit);
            return 3;
        }

        /// <summary>Encodes one instruction (RS low, two nibbles); returns the length.</summary>
        public int EncodeInstruction(int instruction)
        {
            buffer[0] = BacklightBit;
            return Put(1, instruction, 0);
        }

        /// <summary>Encodes the bytes that turn the backlight off and leave E and RS low; returns the length.</summary>
        public int EncodeBacklightOff()
        {
            buffer[0] = 0;
            return 1;
        }

        /// <summary>Marks every cell as holding a space (after a clear instruction went through).</summary>
        public void ClearedAll()
        {
            Fill(0, shown.Length, (byte)' ');
        }

        /// <summary>Marks every cell as unknown, so the next rows are sent whole (after a failed write).</summary>
        public void LostAll()
        {
            Fill(0, shown.Length, Unknown);
        }

        /// <summary>
        /// Encodes what must be sent so that row <paramref name="row"/> shows <paramref name="text"/>: a set-address
        /// instruction and the characters from the first to the last that differ from what the display holds. Returns
        /// the length, 0 when the row already shows the text. Call <see cref="Sent"/> or <see cref="Lost"/> after the write.
        /// </summary>
        public int EncodeRow(int row, string text)
        {
            if (row < 0 || row >= rows)
            {
                throw new System.ArgumentOutOfRangeException("row", "row must be in [0, rows)");
            }

            // Bounded by the row's columns (16 or 20).
            int rowStart = row * columns;
            int first = -1;
            int last = -1;
            for (int c = 0; c < columns; c++)
            {
                if (shown[rowStart + c] != CodeAt(text, c))
                {
                    if (first < 0)
                    {
                        first = c;
                    }

                    last = c;
                }
            }

            pendingRow = first < 0 ? -1 : row;
            if (first < 0)
            {
                return 0;
            }

            pendingFirst = first;
            pendingLast = last;
            int address = (row == 0 ? 0x00 : row == 1 ? 0x40 : row == 2 ? columns : 0x40 + columns) + first;
            buffer[0] = BacklightBit;
            int at = Put(1, SetDdramAddress | address, 0);
            buffer[at] = (byte)(BacklightBit | RegisterSelectBit);
            at++;
            for (int c = first; c <= last; c++)
            {
                at = Put(at, CodeAt(text, c), RegisterSelectBit);
            }

            return at;
        }

        /// <summary>The row last encoded was written: its cells now hold the text.</summary>
        public void Sent(string text)
        {
            if (pendingRow < 0)
            {
                return;
            }

            int rowStart = pendingRow * columns;
            for (int c = pendingFirst; c <= pendingLast; c++)
            {
                shown[rowStart + c] = CodeAt(text, c);
            }

            pendingRow = -1;
        }

        /// <summary>The row last encoded failed to write: its cells are unknown, so it is sent whole next time.</summary>
        public void Lost()
        {
            if (pendingRow >= 0)
            {
                Fill(pendingRow * columns, columns, Unknown);
                pendingRow = -1;
            }
        }

        /// <summary>The display code for a character ('?' for anything outside 0x20-0x7D and for '\').</summary>
        public static byte ToCharacterCode(char c)
        {
            return c >= ' ' && c <= '}' && c != '\\' ? (byte)c : (byte)'?';
        }

        private static byte CodeAt(string text, int column)
        {
            return text != null && column < text.Length ? ToCharacterCode(text[column]) : (byte)' ';
        }

        private int Put(int at, int value, int registerSelect)
        {
            int flags = BacklightBit | registerSelect;
            int high = value & 0xF0;
            int low = (value << 4) & 0xF0;
            buffer[at] = (byte)(high | flags | EnableBit);
            buffer[at + 1] = (byte)(high | flags);
            buffer[at + 2] = (byte)(low | flags | EnableBit);
            buffer[at + 3] = (byte)(low | flags);
            return at + 4;
        }

        private void Fill(int start, int count, byte value)
        {
            for (int i = start; i < start + count; i++)
            {
                shown[i] = value;
            }
        }
    }
}
