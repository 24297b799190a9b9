namespace FreqReadout.Settings
{
    /// <summary>
    /// The numbers of the settings text, read and written with integer arithmetic on digits, so the device
    /// (nanoFramework) and the PC (.NET, in any culture) read and write them identically. A number is a fixed-point
    /// decimal with a key's number of decimal places d (0 to <see cref="MaxDecimals"/>): the scaled integer
    /// m = value x 10^d, and the value is the double nearest to m / 10^d (one IEEE division of two exact doubles).
    /// Text: an optional '-', one or more digits, and optionally '.' followed by one or more digits; nothing else
    /// (no '+', no exponent, no spaces, no thousands separator).
    /// </summary>
    public static class SettingsDecimal
    {
        /// <summary>Most decimal places a key may have.</summary>
        public const int MaxDecimals = 9;

        /// <summary>Largest |m| read or written (10^15, below 2^53, so m and m / 10^d x 10^d are exact enough to round back to m).</summary>
        public const long MaxScaled = 1000000000000000;

        /// <summary>
        /// Reads <paramref name="text"/> as a number of at most <paramref name="decimals"/> decimal places; digits
        /// after those must be zeros ("0.100" reads as 0.1 with one place, "0.15" does not). "-0" reads as 0.
        /// Leading zeros are allowed. Fails on anything else and on |m| &gt; <see cref="MaxScaled"/>.
        /// </summary>
        /// <param name="text">The value text, already trimmed.</param>
        /// <param name="decimals">Decimal places of the key, 0 to <see cref="MaxDecimals"/>.</param>
        /// <param name="scaled">m = value x 10^decimals when the read succeeds, else 0.</param>
        /// <returns>True when the text is such a number.</returns>
        public static bool TryParseScaled(string text, int decimals, out long scaled)
        {
            scaled = 0;
            if (text == null || decimals < 0 || decimals > MaxDecimals)
            {
                return false;
            }

            int i = 0;
            int n = text.Length;
            bool negative = false;
            if (i < n && text[i] == '-')
            {
                negative = true;
                i++;
            }

            long m = 0;
            int integerDigits = 0;
            while (i < n && IsDigit(text[i]))
            {
                m = m * 10 + (text[i] - '0');
                if (m > MaxScaled)
                {
                    return false;
                }

                integerDigits++;
                i++;
            }

            if (integerDigits == 0)
            {
                return false;
            }

            int places = 0;
            if (i < n && text[i] == '.')
            {
                i++;
                int fractionDigits = 0;
                while (i < n && IsDigit(text[i]))
                {
                    int digit = text[i] - '0';
                    if (places < decimals)
                    {
                        m = m * 10 + digit;
                        places++;
                    }
                    else if (digit != 0)
                    {
                        return false;
                    }

                    fractionDigits++;
                    i++;
                    if (m > MaxScaled)
                    {
                        return false;
                    }
                }

                if (fractionDigits == 0)
                {
                    return false;
                }
            }

            if (i != n)
            {
                return false;
            }

            for (; places < decimals; places++)
            {
                m *= 10;
                if (m > MaxScaled)
                {
                    return false;
                }
            }

            scaled = negative ? -m : m;
            return true;
        }

        /// <summary>
        /// True when <paramref name="text"/> follows the grammar of a number (optional '-', digits, optional '.' and
        /// digits), whatever its size and places; <see cref="TryParseScaled"/> may still refuse it for those.
        /// </summary>
        public static bool IsWellFormed(string text)
        {
            if (text == null)
            {
                return false;
            }

            int i = text.Length > 0 && text[0] == '-' ? 1 : 0;
            int integerDigits = 0;
            while (i < text.Length && IsDigit(text[i]))
            {
                integerDigits++;
                i++;
            }

            if (integerDigits == 0)
            {
                return false;
            }

            if (i < text.Length && text[i] == '.')
            {
                i++;
                int fractionDigits = 0;
                while (i < text.Length && IsDigit(text[i]))
                {
                    fractionDigits++;
                    i++;
                }

                if (fractionDigits == 0)
                {
                    return false;
                }
            }

            return i == text.Length;
        }

        /// <summary>
        /// The value of a scaled integer: m / 10^decimals, the double nearest to it (both operands are exact doubles
        /// for |m| &lt;= <see cref="MaxScaled"/>, and IEEE division rounds correctly on both ends).
        /// </summary>
        public static double ToValue(long scaled, int decimals)
        {
            return scaled / PowerOfTen(decimals);
        }

        /// <summary>
        /// The scaled integer nearest to value x 10^decimals, halves away from zero; false for NaN, an infinity or
        /// |value x 10^decimals| beyond <see cref="MaxScaled"/>. For a value made by <see cref="ToValue"/> this gives
        /// its m back exactly (the product is within a few units in the last place of m).
        /// </summary>
        public static bool TryToScaled(double value, int decimals, out long scaled)
        {
            scaled = 0;
            if (decimals < 0 || decimals > MaxDecimals)
            {
                return false;
            }

            double x = value * PowerOfTen(decimals);
            if (!(x >= -MaxScaled && x <= MaxScaled))
            {
                return false;
            }

            scaled = x >= 0 ? (long)(x + 0.5) : -(long)(-x + 0.5);
            return true;
        }

        /// <summary>True when <paramref name="value"/> is exactly a number the text can hold with that many places: ToValue(TryToScaled(value)) == value.</summary>
        public static bool IsOnGrid(double value, int decimals)
        {
            long m;
            return TryToScaled(value, decimals, out m) && ToValue(m, decimals) == value;
        }

        /// <summary>
        /// The text of m / 10^decimals: '-' when m &lt; 0, the integer digits (at least one), and the decimal places
        /// with trailing zeros left out ('.' only when a non-zero place remains): 1 with 6 places is "0.000001",
        /// 100000 with 6 places is "0.1", -25 with 1 place is "-2.5", 0 is "0".
        /// </summary>
        public static string FormatScaled(long scaled, int decimals)
        {
            if (decimals < 0)
            {
                decimals = 0;
            }

            bool negative = scaled < 0;

            // |long.MinValue| has no long; it is far beyond MaxScaled and only guarded here, digit by digit below.
            char[] digits = new char[24];
            int at = digits.Length;
            int places = 0;
            bool anyFraction = false;
            long m = scaled;
            do
            {
                long q = m / 10;
                int digit = (int)(m - (q * 10));
                if (digit < 0)
                {
                    digit = -digit;
                }

                m = q;
                if (places < decimals)
                {
                    if (digit != 0 || anyFraction)
                    {
                        anyFraction = true;
                        digits[--at] = (char)('0' + digit);
                    }

                    places++;
                    if (places == decimals && anyFraction)
                    {
                        digits[--at] = '.';
                    }
                }
                else
                {
                    digits[--at] = (char)('0' + digit);
                }
            }
            while (m != 0 || places < decimals || at == digits.Length || digits[at] == '.');

            if (negative)
            {
                digits[--at] = '-';
            }

            return new string(digits, at, digits.Length - at);
        }

        private static bool IsDigit(char c)
        {
            return c >= '0' && c <= '9';
        }

        private static double PowerOfTen(int decimals)
        {
            double p = 1;
            for (int i = 0; i < decimals; i++)
            {
                p *= 10;
            }

            return p;
        }
    }
}
