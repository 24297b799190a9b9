using FreqReadout.Numerics;

namespace FreqReadout.Firmware.Device
{
    /// <summary>
    /// Fixed-width number fields for the character display, written with integer arithmetic on the rounded value
    /// (never double.ToString, whose formatting differs between nanoFramework and .NET and between cultures), so the
    /// host tests show exactly what the device shows. Every field comes back exactly as wide as asked (right-aligned,
    /// padded with spaces on the left) and holds only ASCII. A value too large for its field is never cut: it shows
    /// <see cref="OverflowMark"/> (measured values) or nines with a '+' (counts). Only display refreshes call this
    /// (at most a few a second), so the few strings it builds are fine; nothing here runs per read.
    /// </summary>
    public static class DisplayNumber
    {
        /// <summary>Shown (after the sign of a signed field) for a measured value whose digits do not fit its field.</summary>
        public const string OverflowMark = "OVR";

        /// <summary>Shown for a value that is not a number (NaN).</summary>
        public const string NoValueMark = "---";

        /// <summary>Most decimal places a field may have.</summary>
        public const int MaxDecimals = 3;

        /// <summary>
        /// A measured value in a field of <paramref name="fieldWidth"/> characters. Decimal places by magnitude: as many
        /// as bring the digits to <paramref name="significantDigits"/> (whole-number digits are never dropped), at most
        /// <paramref name="maxDecimals"/>, fewer when the field is too narrow for them. Rounding is half away from zero
        /// on the value's double; when rounding carries into a new whole-number digit (9.996 at 2 places), the places
        /// are chosen again for the rounded value (10.0). Sign: '-' for a negative value; '+' for a positive one in a
        /// signed field; none when the value rounds to zero (a sign there would be a guess). A value whose whole-number
        /// digits (with the sign) do not fit, or an infinite one, shows the sign and <see cref="OverflowMark"/>; NaN
        /// shows <see cref="NoValueMark"/>.
        /// </summary>
        /// <param name="value">The value.</param>
        /// <param name="signed">True to show '+' before a positive value.</param>
        /// <param name="fieldWidth">Characters of the field (at least 4, so the overflow mark fits with its sign; a narrower field shows '#'s when it overflows).</param>
        /// <param name="maxDecimals">Most decimal places, 0 to <see cref="MaxDecimals"/>.</param>
        /// <param name="significantDigits">Digits to aim for (whole-number digits plus decimal places), at least 1.</param>
        /// <returns>The field, exactly <paramref name="fieldWidth"/> characters.</returns>
        public static string Measured(double value, bool signed, int fieldWidth, int maxDecimals, int significantDigits)
        {
            if (fieldWidth < 1)
            {
                return string.Empty;
            }

            if (double.IsNaN(value))
            {
                return Field(NoValueMark, fieldWidth);
            }

            bool negative = value < 0;
            double magnitude = negative ? -value : value;
            string sign = negative ? "-" : (signed ? "+" : string.Empty);

            // Also catches infinity; no field is 15 characters wide, so nothing is lost, and the scaled value below stays
            // far inside the long range.
            if (magnitude >= 1e15)
            {
                return Overflow(sign, fieldWidth);
            }

            int decimals = DecimalsFor(WholeDigits(magnitude), maxDecimals, significantDigits);
            long scaled;
            string digits = Digits(magnitude, decimals, out scaled);

            // Rounding carried into a new whole-number digit (9.996 -> 10.00): choose the places again for the rounded value.
            int wholeAfterRounding = digits.Length - (decimals > 0 ? decimals + 1 : 0);
            int decimalsAfterRounding = DecimalsFor(wholeAfterRounding, maxDecimals, significantDigits);
            if (decimalsAfterRounding < decimals)
            {
                decimals = decimalsAfterRounding;
                digits = Digits(magnitude, decimals, out scaled);
            }

            // Too wide: drop the places that do not fit, then once more if that rounding carried into a new digit.
            int excess = SignFor(sign, scaled).Length + digits.Length - fieldWidth;
            if (excess > 0 && decimals > 0)
            {
                decimals = decimals > excess ? decimals - excess : 0;
                digits = Digits(magnitude, decimals, out scaled);
                excess = SignFor(sign, scaled).Length + digits.Length - fieldWidth;
                if (excess > 0 && decimals > 0)
                {
                    decimals--;
                    digits = Digits(magnitude, decimals, out scaled);
                    excess = SignFor(sign, scaled).Length + digits.Length - fieldWidth;
                }
            }

            if (excess > 0)
            {
                return Overflow(sign, fieldWidth);
            }

            return Field(SignFor(sign, scaled) + digits, fieldWidth);
        }

        /// <summary>
        /// A count (whole number, 0 or more) in a field of <paramref name="fieldWidth"/> characters. A count with more
        /// digits than the field shows the largest that fits and '+' ("99+" in 3 characters: more than 99, which is
        /// true); a negative count (not a count) shows '?'.
        /// </summary>
        /// <param name="value">The count.</param>
        /// <param name="fieldWidth">Characters of the field, 1 to 19.</param>
        /// <returns>The field, exactly <paramref name="fieldWidth"/> characters.</returns>
        public static string Count(long value, int fieldWidth)
        {
            if (fieldWidth < 1)
            {
                return string.Empty;
            }

            if (value < 0)
            {
                return Field("?", fieldWidth);
            }

            string digits = value.ToString();
            if (digits.Length <= fieldWidth)
            {
                return Field(digits, fieldWidth);
            }

            return string.Empty.PadLeft(fieldWidth - 1, '9') + "+";
        }

        /// <summary><paramref name="text"/> right-aligned in <paramref name="fieldWidth"/> characters (cut from the left if longer; callers never pass one).</summary>
        private static string Field(string text, int fieldWidth)
        {
            return text.Length > fieldWidth ? text.Substring(text.Length - fieldWidth) : text.PadLeft(fieldWidth);
        }

        /// <summary>No sign for a value that rounded to zero.</summary>
        private static string SignFor(string sign, long scaled)
        {
            return scaled == 0 ? string.Empty : sign;
        }

        private static string Overflow(string sign, int fieldWidth)
        {
            string mark = sign + OverflowMark;
            return mark.Length > fieldWidth ? string.Empty.PadLeft(fieldWidth, '#') : mark.PadLeft(fieldWidth);
        }

        /// <summary>Decimal places for a value with <paramref name="wholeDigits"/> whole-number digits.</summary>
        private static int DecimalsFor(int wholeDigits, int maxDecimals, int significantDigits)
        {
            int decimals = significantDigits - wholeDigits;
            int most = maxDecimals < 0 ? 0 : (maxDecimals > MaxDecimals ? MaxDecimals : maxDecimals);
            return decimals < 0 ? 0 : (decimals > most ? most : decimals);
        }

        /// <summary>Digits of the whole part of <paramref name="magnitude"/> (0 &lt;= magnitude &lt; 1e15): 1 below 10.</summary>
        private static int WholeDigits(double magnitude)
        {
            return ((long)magnitude).ToString().Length;
        }

        /// <summary>
        /// |value| rounded to <paramref name="decimals"/> places, as digits with a '.' before the places (a leading "0"
        /// below 1). <paramref name="scaled"/> is the rounded value times 10^decimals.
        /// </summary>
        private static string Digits(double magnitude, int decimals, out long scaled)
        {
            scaled = ScalarMath.RoundToLong(magnitude * Scale(decimals));
            string text = scaled.ToString();
            if (decimals == 0)
            {
                return text;
            }

            if (text.Length <= decimals)
            {
                text = text.PadLeft(decimals + 1, '0');
            }

            int whole = text.Length - decimals;
            return text.Substring(0, whole) + "." + text.Substring(whole);
        }

        private static double Scale(int decimals)
        {
            switch (decimals)
            {
                case 1: return 10.0;
                case 2: return 100.0;
                case 3: return 1000.0;
                default: return 1.0;
            }
        }
    }
}
