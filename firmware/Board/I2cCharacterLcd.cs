using System;
using System.Device.I2c;
using System.Threading;
using FreqReadout.Firmware.Ports;
using nanoFramework.Hardware.Esp32;

namespace FreqReadout.Firmware.Board
{
    /// <summary>
    /// A character LCD with an HD44780-compatible controller (16x2 or 20x4) behind a PCF8574 (or PCF8574A) I2C
    /// "backpack", over nanoFramework's <c>System.Device.I2c</c> (signatures from nanoframework/System.Device.I2c tag
    /// v1.1.29). Shows the device loop's DisplayText lines: on 4 rows, frequency, shift and status on rows 1-3 and
    /// row 4 free for <see cref="TryShowFooter"/>; on 2 rows, shift and status (the frequency line is left out).
    /// <para>
    /// Bit mapping (an assumption: the common backpack wiring; other backpacks map bits differently, check yours with
    /// a continuity tester and change the constants): PCF8574 P0 = RS, P1 = R/W, P2 = E, P3 = backlight transistor,
    /// P4..P7 = D4..D7. The PCF8574 drives P7..P0 from each byte written to it (NXP PCF8574/74A data sheet, "Writing to
    /// the port", from memory); its address is 0100 A2 A1 A0 (0x20-0x27, 0x27 with the address pads open) and the
    /// PCF8574A's is 0111 A2 A1 A0 (0x38-0x3F). Its bus runs at up to 100 kHz (standard mode), so this adapter does too.
    /// </para>
    /// <para>
    /// Controller (Hitachi HD44780U data sheet, from memory): 4-bit interface, high nibble first, each nibble latched on
    /// the falling edge of E; the set-up is "initialising by instruction" for the 4-bit interface (the data sheet's
    /// Figure 24): wait more than 40 ms after power rises, send the nibble 3 three times (waits of more than 4.1 ms
    /// and 100 us after the first two), then 2 (4-bit mode), then function set 0x28 (4 bits, 2 lines: 4-row modules are
    /// 2-line internally, 5x8 dots), display off 0x08, clear 0x01 (1.52 ms), entry mode 0x06, display on 0x0C.
    /// Instructions take 37 us; one I2C byte at 100 kHz takes 90 us, so the bus itself paces the controller and the
    /// busy flag is never read (R/W stays low). Every nibble is three bus bytes when RS changes (E low with the new RS
    /// first, for the address set-up time) and two otherwise (E high, E low): a character is 4 bytes, about 0.4 ms.
    /// DDRAM rows start at 0x00, 0x40, columns, 0x40 + columns (0x14, 0x54 on 20 columns).
    /// </para>
    /// <para>
    /// Cost: only characters that changed are sent (one address instruction plus the span from the first to the last
    /// changed column of a row), because the I2C write blocks the read loop: a typical refresh (a few digits) takes a
    /// few ms, a full three-row rewrite about 25 ms. Characters outside 0x20-0x7D, and '\' (a yen sign in the common
    /// A00 character ROM), are shown as '?'. A failed write is counted and makes the next refresh rewrite every row.
    /// </para>
    /// </summary>
    public sealed class I2cCharacterLcd : IDisplayPort, IDisposable
    {
        /// <summary>The usual address of a PCF8574 backpack (address pads open).</summary>
        public const int Pcf8574Address = 0x27;

        /// <summary>The usual address of a PCF8574A backpack (address pads open).</summary>
        public const int Pcf8574AAddress = 0x3F;

        private const int RegisterSelectBit = 0x01;
        private const int EnableBit = 0x04;
        private const int BacklightBit = 0x08;
        private const int SetDdramAddress = 0x80;
        private const byte Unknown = 0;

        private readonly I2cDevice device;
        private readonly int columns;
        private readonly int rows;
        private readonly byte[] shown;
        private readonly byte[] wanted;
        private readonly byte[] transfer;
        private long writeFailures;

        /// <summary>Routes I2C bus 1 to the pins, opens the backpack and initialises the controller (takes about 80 ms).</summary>
        /// <param name="dataPin">GPIO for SDA (21 on most classic ESP32 boards).</param>
        /// <param name="clockPin">GPIO for SCL (22 on most classic ESP32 boards).</param>
        /// <param name="address">7-bit I2C address of the backpack (<see cref="Pcf8574Address"/> or <see cref="Pcf8574AAddress"/>).</param>
        /// <param name="columns">Characters per row: 16 or 20.</param>
        /// <param name="rows">Rows: 2 or 4.</param>
        public I2cCharacterLcd(int dataPin, int clockPin, int address, int columns, int rows)
        {
            if (columns != 16 && columns != 20)
            {
                throw new ArgumentOutOfRangeException("columns", "columns must be 16 or 20");
            }

            if (rows != 2 && rows != 4)
            {
                throw new ArgumentOutOfRangeException("rows", "rows must be 2 or 4");
            }

            this.columns = columns;
            this.rows = rows;
            shown = new byte[rows * columns];
            wanted = new byte[columns];
            transfer = new byte[2 + (4 * (columns + 1))];
            Configuration.SetPinFunction(dataPin, DeviceFunction.I2C1_DATA);
            Configuration.SetPinFunction(clockPin, DeviceFunction.I2C1_CLOCK);
            device = new I2cDevice(new I2cConnectionSettings(1, address, I2cBusSpeed.StandardMode));
            Initialise();
        }

        /// <summary>Characters per row.</summary>
        public int LineWidth
        {
            get { return columns; }
        }

        /// <summary>I2C writes that failed (no acknowledge, bus error) since the start.</summary>
        public long WriteFailures
        {
            get { return writeFailures; }
        }

        /// <summary>Shows the readout lines (see the class notes for which row shows which line).</summary>
        public void Show(string line1, string line2, string line3)
        {
            if (rows >= 4)
            {
                WriteRow(0, line1);
                WriteRow(1, line2);
                WriteRow(2, line3);
            }
            else
            {
                WriteRow(0, line2);
                WriteRow(1, line3);
            }
        }

        /// <summary>Shows a line on row 4 (device health, for the board check); false on a 2-row display or when the write failed.</summary>
        public bool TryShowFooter(string line)
        {
            return rows >= 4 && WriteRow(3, line);
        }

        /// <summary>Turns the backlight off and releases the bus device.</summary>
        public void Dispose()
        {
            transfer[0] = 0;
            Send(1);
            device.Dispose();
        }

        private void Initialise()
        {
            // HD44780U initialising by instruction, 4-bit interface (timings in the class notes).
            Thread.Sleep(50);
            bool ok = SendInitNibble(0x30);
            Thread.Sleep(5);
            ok &= SendInitNibble(0x30);
            Thread.Sleep(1);
            ok &= SendInitNibble(0x30);
            ok &= SendInitNibble(0x20);
            ok &= SendCommand(0x28);
            ok &= SendCommand(0x08);
            ok &= SendCommand(0x01);
            Thread.Sleep(2);
            ok &= SendCommand(0x06);
            ok &= SendCommand(0x0C);

            // After a clear every cell holds a space; after a failure nothing is known and every row is rewritten.
            byte fill = ok ? (byte)' ' : Unknown;
            for (int i = 0; i < shown.Length; i++)
            {
                shown[i] = fill;
            }
        }

        private bool SendInitNibble(int highNibble)
        {
            transfer[0] = (byte)(highNibble | BacklightBit);
            transfer[1] = (byte)(highNibble | BacklightBit | EnableBit);
            transfer[2] = (byte)(highNibble | BacklightBit);
            return Send(3);
        }

        private bool SendCommand(int command)
        {
            transfer[0] = BacklightBit;
            return Send(PutByte(1, command, 0));
        }

        private bool WriteRow(int row, string text)
        {
            // Bounded by the row's columns (16 or 20).
            int rowStart = row * columns;
            int first = -1;
            int last = -1;
            for (int c = 0; c < columns; c++)
            {
                byte code = text != null && c < text.Length ? ToCharacterCode(text[c]) : (byte)' ';
                wanted[c] = code;
                if (shown[rowStart + c] != code)
                {
                    if (first < 0)
                    {
                        first = c;
                    }

                    last = c;
                }
            }

            if (first < 0)
            {
                return true;
            }

            int address = (row == 0 ? 0x00 : row == 1 ? 0x40 : row == 2 ? columns : 0x40 + columns) + first;
            transfer[0] = BacklightBit;
            int at = PutByte(1, SetDdramAddress | address, 0);
            transfer[at] = (byte)(BacklightBit | RegisterSelectBit);
            at++;
            for (int c = first; c <= last; c++)
            {
                at = PutByte(at, wanted[c], RegisterSelectBit);
            }

            if (!Send(at))
            {
                for (int c = 0; c < columns; c++)
                {
                    shown[rowStart + c] = Unknown;
                }

                return false;
            }

            for (int c = first; c <= last; c++)
            {
                shown[rowStart + c] = wanted[c];
            }

            return true;
        }

        private int PutByte(int at, int value, int registerSelect)
        {
            int flags = BacklightBit | registerSelect;
            int high = value & 0xF0;
            int low = (value << 4) & 0xF0;
            transfer[at] = (byte)(high | flags | EnableBit);
            transfer[at + 1] = (byte)(high | flags);
            transfer[at + 2] = (byte)(low | flags | EnableBit);
            transfer[at + 3] = (byte)(low | flags);
            return at + 4;
        }

        private bool Send(int length)
        {
            try
            {
                // I2cDevice.Write takes the struct SpanByte and returns the struct I2cTransferResult: the API forces
                // both, once per row written (a few per display refresh, never per read).
                I2cTransferResult result = device.Write(new SpanByte(transfer, 0, length));
                if (result.Status == I2cTransferStatus.FullTransfer)
                {
                    return true;
                }
            }
            catch (Exception)
            {
                // A bus fault: counted below like a refused write.
            }

            writeFailures++;
            return false;
        }

        private static byte ToCharacterCode(char c)
        {
            return c >= ' ' && c <= '}' && c != '\\' ? (byte)c : (byte)'?';
        }
    }
}
