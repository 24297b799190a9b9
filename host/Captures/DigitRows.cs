using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.Intrinsics;

namespace FreqReadout.Host.Captures;

/// <summary>
/// The text reader's fast path for one digits-only row: 1 to 19 ASCII digits, then "\n" or "\r\n". Rows of up to 15
/// digits are read without a loop per digit: one 16-byte vector comparison finds the row's length, and the digits are
/// combined eight at a time in a 64-bit word (three multiply-and-shift steps, "SWAR"; the method of D. Lemire,
/// "Faster integer parsing", 2018, as fast_float's <c>parse_eight_digits_unrolled</c> uses it — from memory). Longer
/// rows take the digit loop. Anything else is left to the line parser.
/// </summary>
internal static class DigitRows
{
    /// <summary>Bytes that must be readable from the row's start (the longest row, 19 digits and CRLF, plus one).</summary>
    public const int ReadableBytes = 22;

    private const ulong Zeros = 0x3030303030303030UL;

    private static readonly ulong[] PowersOfTen =
    {
        1UL, 10UL, 100UL, 1_000UL, 10_000UL, 100_000UL, 1_000_000UL, 10_000_000UL, 100_000_000UL,
    };

    /// <summary>
    /// Reads the row that starts at <paramref name="start"/>: the bytes it takes, line end included, with its
    /// <paramref name="value"/>; 0 when the line is not a plain row of 1-19 digits (blank, comment, other characters,
    /// more digits, no line end), and the line parser must read it.
    /// </summary>
    /// <param name="bytes">The buffer; at least <see cref="ReadableBytes"/> bytes from <paramref name="start"/> are read.</param>
    /// <param name="start">First byte of the row.</param>
    /// <param name="value">The row's value (no overflow: at most 19 digits).</param>
    public static int TryRead(byte[] bytes, int start, out ulong value)
    {
        if (start < 0 || bytes.Length - start < ReadableBytes || !BitConverter.IsLittleEndian)
        {
            return TryReadByDigit(bytes, start, out value);
        }

        ref byte at = ref bytes[start];
        Vector128<byte> text = Vector128.LoadUnsafe(ref at);
        uint notDigit = Vector128.GreaterThan(text - Vector128.Create((byte)'0'), Vector128.Create((byte)9)).ExtractMostSignificantBits();
        int digits = BitOperations.TrailingZeroCount(notDigit); // 32 when all 16 bytes are digits
        if ((uint)(digits - 1) >= 15u)
        {
            // No digit at all (blank, comment, bad value), or 16 and more digits: the digit loop decides.
            return digits == 0 ? NotARow(out value) : TryReadByDigit(bytes, start, out value);
        }

        ulong first = Unsafe.ReadUnaligned<ulong>(ref at) - Zeros;
        if (digits <= 8)
        {
            // Bytes past the row (and any borrow from them) move out of the word; zeros come in as leading digits.
            value = Eight(first << (8 * (8 - digits)));
        }
        else
        {
            ulong second = Unsafe.ReadUnaligned<ulong>(ref Unsafe.Add(ref at, 8)) - Zeros;
            value = (Eight(first) * PowersOfTen[digits - 8]) + Eight(second << (8 * (16 - digits)));
        }

        byte end = Unsafe.Add(ref at, digits);
        if (end == (byte)'\n')
        {
            return digits + 1;
        }

        return end == (byte)'\r' && Unsafe.Add(ref at, digits + 1) == (byte)'\n' ? digits + 2 : NotARow(out value);
    }

    /// <summary>The same row read one digit at a time (rows of 16-19 digits, and the reference the tests compare with).</summary>
    internal static int TryReadByDigit(byte[] bytes, int start, out ulong value)
    {
        int i = start;
        value = 0;
        uint digit;
        while (i < bytes.Length && (digit = (uint)(bytes[i] - '0')) <= 9 && i - start < 19)
        {
            value = (value * 10) + digit;
            i++;
        }

        if (i == start || i >= bytes.Length)
        {
            return NotARow(out value);
        }

        if (bytes[i] == (byte)'\n')
        {
            return i + 1 - start;
        }

        return bytes[i] == (byte)'\r' && i + 1 < bytes.Length && bytes[i + 1] == (byte)'\n' ? i + 2 - start : NotARow(out value);
    }

    /// <summary>Eight digits, each byte 0-9, the first digit in the lowest byte, as their number.</summary>
    private static ulong Eight(ulong digits)
    {
        digits = (digits * 10) + (digits >> 8); // each 16-bit lane's low byte: two digits
        return ((((digits & 0x000000FF000000FFUL) * (100 + (1000000UL << 32)))
            + (((digits >> 16) & 0x000000FF000000FFUL) * (1 + (10000UL << 32)))) >> 32) & 0xFFFFFFFFUL;
    }

    private static int NotARow(out ulong value)
    {
        value = 0;
        return 0;
    }
}
