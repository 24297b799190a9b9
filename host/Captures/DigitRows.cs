using System.Numerics;
using System.Runtime.CompilerServices;
using System.Runtime.InteropServices;
using System.Runtime.Intrinsics;
using System.Runtime.Intrinsics.X86;

namespace FreqReadout.Host.Captures;

/// <summary>
/// The text reader's fast path for one digits-only row: 1 to 19 ASCII digits, then "\n" or "\r\n". Rows of up to 15
/// digits are read without a loop per digit: one 16-byte vector comparison finds the row's length; up to 8 digits are
/// combined in a 64-bit word (three multiply-and-shift steps, "SWAR"; the method of D. Lemire, "Faster integer
/// parsing", 2018, as fast_float's <c>parse_eight_digits_unrolled</c> uses it — from memory), 9 to 15 with SSE where
/// the processor has it (<see cref="Sixteen"/>), else as two such words. Longer rows take the digit loop. Anything else
/// is left to the line parser.
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

        value = Value(ref at, digits);

        byte end = Unsafe.Add(ref at, digits);
        if (end == (byte)'\n')
        {
            return digits + 1;
        }

        return end == (byte)'\r' && Unsafe.Add(ref at, digits + 1) == (byte)'\n' ? digits + 2 : NotARow(out value);
    }

    /// <summary>Bytes <see cref="ReadRun"/> looks at in one step (and it needs <see cref="ReadableBytes"/> more readable).</summary>
    public const int WindowBytes = 64;

    /// <summary>
    /// Reads a run of plain rows — 1 to 15 digits, then "\n" — from <paramref name="position"/> into the batch, without
    /// a scan per row: each 64-byte window is classified at once (a bit mask of its line ends and one of its other
    /// non-digit bytes), and every row that ends in the window before any other character is parsed from its start and
    /// length, so no row waits for the one before it. Stops at the first line that is not such a row (CRLF, blank,
    /// comment, longer, a value over <paramref name="limit"/>), when the batch is full, or when fewer than
    /// <see cref="WindowBytes"/> + <see cref="ReadableBytes"/> bytes remain; <paramref name="position"/> is then the start
    /// of the first line not read, for <see cref="TryRead"/> and the line parser. Rows read are those <see cref="TryRead"/>
    /// would read, with the same values.
    /// </summary>
    /// <param name="bytes">The buffer.</param>
    /// <param name="position">Start of a line; moved past the rows read.</param>
    /// <param name="end">One past the last valid byte.</param>
    /// <param name="limit">Largest value a row may have (the timer's).</param>
    /// <param name="batch">Rows are appended as bare rows (tick, count 0, line number).</param>
    /// <param name="line">Line number of the last line read; advanced by one per row.</param>
    /// <returns>Rows read.</returns>
    public static int ReadRun(byte[] bytes, ref int position, int end, ulong limit, CaptureRowBatch batch, ref long line)
    {
        if (!BitConverter.IsLittleEndian || end > bytes.Length)
        {
            return 0;
        }

        ulong[] ticks = batch.Ticks;
        ulong[] counts = batch.Counts;
        long[] lines = batch.LineNumbers;
        int n = batch.Count;
        int first = n;
        int capacity = ticks.Length;
        int p = position;
        long number = line;
        Vector128<byte> zero = Vector128.Create((byte)'0');
        Vector128<byte> nine = Vector128.Create((byte)9);
        Vector128<byte> lf = Vector128.Create((byte)'\n');
        while (n < capacity && end - p >= WindowBytes + ReadableBytes)
        {
            ref byte window = ref bytes[p];
            ulong lineEnds = 0;
            ulong other = 0;
            for (int k = 0; k < WindowBytes; k += 16)
            {
                Vector128<byte> text = Vector128.LoadUnsafe(ref Unsafe.Add(ref window, k));
                lineEnds |= (ulong)Vector128.Equals(text, lf).ExtractMostSignificantBits() << k;
                other |= (ulong)Vector128.GreaterThan(text - zero, nine).ExtractMostSignificantBits() << k;
            }

            other &= ~lineEnds;
            if (other != 0)
            {
                lineEnds &= (other & (0UL - other)) - 1; // only the line ends before the first other character
            }

            if (lineEnds == 0)
            {
                break; // the line at p is not a plain row, or is longer than the window: the caller's
            }

            int rowStart = 0;
            while (lineEnds != 0)
            {
                int lineEnd = BitOperations.TrailingZeroCount(lineEnds);
                int digits = lineEnd - rowStart;
                if ((uint)(digits - 1) >= 15u)
                {
                    goto Stop; // blank, or 16 digits and more
                }

                ulong value = Value(ref Unsafe.Add(ref window, rowStart), digits);
                if (value > limit)
                {
                    goto Stop;
                }

                number++;
                ticks[n] = value;
                counts[n] = 0;
                lines[n] = number;
                n++;
                rowStart = lineEnd + 1;
                if (n == capacity)
                {
                    goto Stop;
                }

                lineEnds &= lineEnds - 1;
            }

            p += rowStart;
            continue;

        Stop:
            p += rowStart;
            break;
        }

        position = p;
        line = number;
        batch.CommitBareRows(n);
        return n - first;
    }

    /// <summary>The value of <paramref name="digits"/> (1-15) ASCII digits at <paramref name="at"/>; 16 bytes from it are read.</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)] // per row in the loops above; not inlined on its own (a profile showed it)
    private static ulong Value(ref byte at, int digits)
    {
        if (digits <= 8)
        {
            // Bytes past the row (and any borrow from them) move out of the word; zeros come in as leading digits.
            return Eight((Unsafe.ReadUnaligned<ulong>(ref at) - Zeros) << (8 * (8 - digits)));
        }

        return VectorDigits ? Sixteen(ref at, digits) : TwoEights(ref at, digits);
    }

    /// <summary>True when the processor has the SSE steps of <see cref="Sixteen"/> (SSSE3 and SSE4.1).</summary>
    private static bool VectorDigits => Ssse3.IsSupported && Sse41.IsSupported;

    /// <summary>
    /// The value of <paramref name="digits"/> (9-15) digits at <paramref name="start"/> by the vector steps
    /// (<paramref name="vector"/> true, where the processor has them) or the two 64-bit words, for the tests that
    /// check each against the digit loop whichever the processor takes; 16 bytes from start are read.
    /// </summary>
    internal static ulong LongRowValue(byte[] bytes, int start, int digits, bool vector)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(digits, 9);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(digits, 15);
        ArgumentOutOfRangeException.ThrowIfGreaterThan(start, bytes.Length - 16);
        ref byte at = ref bytes[start];
        return vector && VectorDigits ? Sixteen(ref at, digits) : TwoEights(ref at, digits);
    }

    /// <summary>9 to 15 digits as two 64-bit words of eight digits (the second shifted so that only its digits count).</summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ulong TwoEights(ref byte at, int digits)
    {
        ulong first = Unsafe.ReadUnaligned<ulong>(ref at) - Zeros;
        ulong second = Unsafe.ReadUnaligned<ulong>(ref Unsafe.Add(ref at, 8)) - Zeros;
        return (Eight(first) * PowersOfTen[digits - 8]) + Eight(second << (8 * (16 - digits)));
    }

    /// <summary>
    /// The value of 9 to 15 digits at <paramref name="at"/> with SSE (16 bytes from it are read): the digits moved to the right end of a 16-byte
    /// vector (zeros in front), then combined pairwise in three multiply-add steps (pairs, groups of four, groups of
    /// eight) and the two groups of eight joined: one pass for both halves where <see cref="Eight"/> takes two
    /// (the SIMD digit parsing of W. Mula and D. Lemire, from memory; the tests check it against ulong.Parse).
    /// </summary>
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
    private static ulong Sixteen(ref byte at, int digits)
    {
        Vector128<byte> text = Vector128.LoadUnsafe(ref at) - Vector128.Create((byte)'0');
        Vector128<byte> order = Vector128.LoadUnsafe(ref MemoryMarshal.GetArrayDataReference(RightAlign), (nuint)(digits * 16));
        Vector128<byte> aligned = Ssse3.Shuffle(text, order);
        Vector128<short> pairs = Ssse3.MultiplyAddAdjacent(aligned, Vector128.Create(10, 1, 10, 1, 10, 1, 10, 1, 10, 1, 10, 1, 10, 1, 10, (sbyte)1));
        Vector128<int> fours = Sse2.MultiplyAddAdjacent(pairs, Vector128.Create(100, 1, 100, 1, 100, 1, 100, (short)1));
        Vector128<ushort> packed = Sse41.PackUnsignedSaturate(fours, fours);
        Vector128<int> eights = Sse2.MultiplyAddAdjacent(packed.AsInt16(), Vector128.Create(10000, 1, 10000, 1, 10000, 1, 10000, (short)1));
        ulong both = eights.AsUInt64().ToScalar();
        return ((both & 0xFFFFFFFFUL) * 100_000_000UL) + (both >> 32);
    }

    /// <summary>
    /// For n digits (row n of 16 bytes, n = 0 to 16), the byte shuffle that moves them to the right end of a vector:
    /// output byte i takes input byte i - (16 - n), and 0x80 (a zero) where that is negative.
    /// </summary>
    private static readonly byte[] RightAlign = MakeRightAlign();

    private static byte[] MakeRightAlign()
    {
        var table = new byte[17 * 16];
        for (int n = 0; n <= 16; n++)
        {
            for (int i = 0; i < 16; i++)
            {
                int source = i - (16 - n);
                table[(n * 16) + i] = source >= 0 ? (byte)source : (byte)0x80;
            }
        }

        return table;
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
    [MethodImpl(MethodImplOptions.AggressiveInlining)]
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
