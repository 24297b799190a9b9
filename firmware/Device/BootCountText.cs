namespace FreqReadout.Firmware.Device
{
    /// <summary>The boot counter's stored form: decimal digits, optionally followed by a line end. Culture-free, no allocation when parsing.</summary>
    public static class BootCountText
    {
        /// <summary>Reads the digits of <paramref name="text"/> (1 to 10, value at most 4294967295, then optional CR/LF/space); false otherwise.</summary>
        public static bool TryParse(string text, out uint count)
        {
            count = 0;
            if (text == null)
            {
                return false;
            }

            ulong value = 0;
            int digits = 0;
            int i = 0;
            for (; i < text.Length && digits <= 10; i++)    // bound: 11 characters of digits
            {
                char c = text[i];
                if (c < '0' || c > '9')
                {
                    break;
                }

                value = value * 10 + (ulong)(c - '0');
                digits++;
            }

            if (digits == 0 || digits > 10 || value > uint.MaxValue)
            {
                return false;
            }

            for (; i < text.Length; i++)    // bound: the text read from the store (a few characters)
            {
                char c = text[i];
                if (c != '\r' && c != '\n' && c != ' ')
                {
                    return false;
                }
            }

            count = (uint)value;
            return true;
        }

        /// <summary>The stored form of <paramref name="count"/>: its decimal digits and a line feed.</summary>
        public static string Format(uint count)
        {
            return count.ToString() + "\n";
        }
    }
}
