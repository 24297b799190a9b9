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
    /// The bytes come from <see cref="Hd44780Pcf8574Encoder"/> (bit mapping, nibble timing and character set there).
    /// <para>
    /// PCF8574 (NXP PCF8574/74A data sheet, from memory): each byte written drives P7..P0; address 0100 A2 A1 A0
    /// (0x20-0x27, 0x27 with the address pads open), PCF8574A 0111 A2 A1 A0 (0x38-0x3F); the bus runs at up to 100 kHz
    /// (standard mode), so this adapter does too.
    /// </para>
    /// <para>
    /// Controller set-up (Hitachi HD44780U data sheet, "initialising by instruction", 4-bit interface, Figure 24, from
    /// memory): wait more than 40 ms after power rises, send the nibble 3 three times (waits of more than 4.1 ms and
    /// 100 us after the first two), then 2 (4-bit mode), then function set 0x28 (4 bits, 2 lines: 4-row modules are
    /// 2-line internally, 5x8 dots), display off 0x08, clear 0x01 (1.52 ms), entry mode 0x06 (increment, no shift),
    /// display on 0x0C (no cursor). Instructions take 37 us; one I2C byte at 100 kHz takes 90 us, so the bus itself
    /// paces the controller and the busy flag is never read.
    /// </para>
    /// <para>
    /// Cost: a character is 4 bus bytes, about 0.4 ms, and the write blocks the read loop; only changed characters are
    /// sent, so a typical refresh (a few digits) takes a few ms and a full three-row rewrite about 25 ms. A failed
    /// write is counted and makes the next refresh send that row whole (after a failed set-up, every row). The set-up
    /// itself is not repeated: a display that missed it (connected late, a bus fault at start) shows nothing useful
    /// until the board restarts; <see cref="WriteFailures"/> tells.
    /// </para>
    /// </summary>
    public sealed class I2cCharacterLcd : IDisplayPort, IDisposable
    {
        /// <summary>The usual address of a PCF8574 backpack (address pads open).</summary>
        public const int Pcf8574Address = 0x27;

        /// <summary>The usual address of a PCF8574A backpack (address pads open).</summary>
        public const int Pcf8574AAddress = 0x3F;

        private readonly I2cDevice device;
        private readonly Hd44780Pcf8574Encoder encoder;
        private long writeFailures;

        /// <summary>Routes I2C bus 1 to the pins, opens the backpack and initialises the controller (takes about 80 ms).</summary>
        /// <param name="dataPin">GPIO for SDA (21 on most classic ESP32 boards).</param>
        /// <param name="clockPin">GPIO for SCL (22 on most classic ESP32 boards).</param>
        /// <param name="address">7-bit I2C address of the backpack (<see cref="Pcf8574Address"/> or <see cref="Pcf8574AAddress"/>).</param>
        /// <param name="columns">Characters per row: 16 or 20.</param>
        /// <param name="rows">Rows: 2 or 4.</param>
        public I2cCharacterLcd(int dataPin, int clockPin, int address, int columns, int rows)
        {
            encoder = new Hd44780Pcf8574Encoder(columns, rows);
            Configuration.SetPinFunction(dataPin, DeviceFunction.I2C1_DATA);
            Configuration.SetPinFunction(clockPin, DeviceFunction.I2C1_CLOCK);
            device = new I2cDevice(new I2cConnectionSettings(1, address, I2cBusSpeed.StandardMode));
            Initialise();
        }

        /// <summary>Characters per row.</summary>
        public int LineWidth
        {
            get { return encoder.Columns; }
        }

        /// <summary>I2C writes that failed (no acknowledge, bus error) since the start.</summary>
        public long WriteFailures
        {
            get { return writeFailures; }
        }

        /// <summary>Shows the readout lines (see the class notes for which row shows which line).</summary>
        public void Show(string line1, string line2, string line3)
        {
            if (encoder.Rows >= 4)
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
            return encoder.Rows >= 4 && WriteRow(3, line);
        }

        /// <summary>Turns the backlight off and releases the bus device.</summary>
        public void Dispose()
        {
            Send(encoder.EncodeBacklightOff());
            device.Dispose();
        }

        private void Initialise()
        {
            Thread.Sleep(50);
            bool ok = Send(encoder.EncodeInitNibble(0x30));
            Thread.Sleep(5);
            ok &= Send(encoder.EncodeInitNibble(0x30));
            Thread.Sleep(1);
            ok &= Send(encoder.EncodeInitNibble(0x30));
            ok &= Send(encoder.EncodeInitNibble(0x20));
            ok &= Send(encoder.EncodeInstruction(0x28));
            ok &= Send(encoder.EncodeInstruction(0x08));
            ok &= Send(encoder.EncodeInstruction(0x01));
            Thread.Sleep(2);
            ok &= Send(encoder.EncodeInstruction(0x06));
            ok &= Send(encoder.EncodeInstruction(0x0C));
            if (ok)
            {
                encoder.ClearedAll();
            }
            else
            {
                encoder.LostAll();
            }
        }

        private bool WriteRow(int row, string text)
        {
            int length = encoder.EncodeRow(row, text);
            if (length == 0)
            {
                return true;
            }

            if (Send(length))
            {
                encoder.Sent(text);
                return true;
            }

            encoder.Lost();
            return false;
        }

        private bool Send(int length)
        {
            try
            {
                // I2cDevice.Write takes the struct SpanByte and returns the struct I2cTransferResult: the API forces
                // both, once per row written (a few per display refresh, never per read).
                I2cTransferResult result = device.Write(new SpanByte(encoder.Buffer, 0, length));
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
    }
}
