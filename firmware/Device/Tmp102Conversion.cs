namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// The Texas Instruments TMP102's temperature register to deg C (TMP102 data sheet, TI, SBOS397, "Temperature
    /// Register" and its 12-bit temperature data format table; from memory): two bytes, most significant first, the
    /// temperature left-justified two's complement at 0.0625 deg C an LSB. In the default normal mode it is 12 bits and
    /// bit 0 of the second byte reads 0; in extended mode (EM = 1) it is 13 bits and that bit reads 1.
    /// </summary>
    public static class Tmp102Conversion
    {
        /// <summary>Degrees C per LSB in both modes.</summary>
        public const double CelsiusPerLsb = 0.0625;

        /// <summary>The register's pointer value (TMP102 pointer register: 00 = temperature, from memory).</summary>
        public const byte TemperatureRegister = 0x00;

        /// <summary>The address with ADD0 tied to ground (from memory; 0x49 to V+, 0x4A to SDA, 0x4B to SCL).</summary>
        public const int DefaultAddress = 0x48;

        /// <summary>The register's raw value as counts of <see cref="CelsiusPerLsb"/> (sign-extended; 12 or 13 bits by the mode bit).</summary>
        public static int CountsFromRegister(byte msb, byte lsb)
        {
            int word = (msb << 8) | lsb;
            if ((lsb & 1) == 0)
            {
                int counts = word >> 4;                               // 12 bits
                return (counts & 0x800) != 0 ? counts - 0x1000 : counts;
            }

            int extended = word >> 3;                                 // 13 bits (extended mode)
            return (extended & 0x1000) != 0 ? extended - 0x2000 : extended;
        }

        /// <summary>The register's two bytes as deg C.</summary>
        public static double CelsiusFromRegister(byte msb, byte lsb)
        {
            return CountsFromRegister(msb, lsb) * CelsiusPerLsb;
        }
    }
}
