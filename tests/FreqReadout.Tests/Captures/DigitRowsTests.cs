using System.Globalization;
using System.Text;
using FreqReadout.Host.Captures;

namespace FreqReadout.Tests.Captures;

/// <summary>
/// The text reader's vector fast path for digits-only rows (<see cref="DigitRows"/>) against .NET's own
/// <see cref="ulong.TryParse(string, NumberStyles, IFormatProvider, out ulong)"/> (the general-purpose reference) and
/// against the digit-by-digit loop it replaced: the same rows taken, the same values, the same refusals.
/// </summary>
public sealed class DigitRowsTests
{
    [Theory]
    [InlineData("0\n", 0UL, 2)]
    [InlineData("7\r\n", 7UL, 3)]
    [InlineData("12345678\n", 12345678UL, 9)]
    [InlineData("123456789\n", 123456789UL, 10)]
    [InlineData("3704912942\n", 3704912942UL, 11)]
    [InlineData("000000000000042\n", 42UL, 16)]
    [InlineData("999999999999999\n", 999999999999999UL, 16)]
    [InlineData("1234567890123456\n", 1234567890123456UL, 17)]
    [InlineData("18446744073709551615\n", 0UL, 0)] // 20 digits: the line parser's (it names the overflow)
    [InlineData("9999999999999999999\r\n", 9999999999999999999UL, 21)]
    [InlineData("\n", 0UL, 0)]
    [InlineData("# note\n", 0UL, 0)]
    [InlineData("12a\n", 0UL, 0)]
    [InlineData("12 \n", 0UL, 0)]
    [InlineData("12\r", 0UL, 0)]
    [InlineData("12,3\n", 0UL, 0)]
    [InlineData("+12\n", 0UL, 0)]
    public void ReadsPlainRowsAndRefusesTheRest(string row, ulong value, int taken)
    {
        byte[] bytes = Padded(row);
        Assert.Equal(taken, DigitRows.TryRead(bytes, 0, out ulong got));
        Assert.Equal(value, got);
        Assert.Equal(taken, DigitRows.TryReadByDigit(bytes, 0, out ulong byDigit));
        Assert.Equal(value, byDigit);
    }

    [Fact]
    public void AgreesWithUlongParseOnRandomRows()
    {
        var random = new Random(20261203);
        string[] endings = { "\n", "\r\n", "\r", " \n", ",5\n", "x", string.Empty };
        for (int n = 0; n < 200_000; n++)
        {
            int digits = random.Next(0, 22);
            var text = new StringBuilder();
            for (int i = 0; i < digits; i++)
            {
                text.Append((char)('0' + random.Next(10)));
            }

            string ending = endings[random.Next(endings.Length)];
            string row = text + ending;
            byte[] bytes = Padded(row, random);
            int start = random.Next(0, 5);
            byte[] shifted = new byte[bytes.Length + start];
            random.NextBytes(shifted.AsSpan(0, start));
            bytes.CopyTo(shifted, start);

            int taken = DigitRows.TryRead(shifted, start, out ulong value);
            bool plain = digits is >= 1 and <= 19 && (ending == "\n" || ending == "\r\n");
            if (plain && ulong.TryParse(text.ToString(), NumberStyles.None, CultureInfo.InvariantCulture, out ulong expected))
            {
                Assert.True(taken == digits + ending.Length, $"row {Escape(row)}: took {taken}");
                Assert.Equal(expected, value);
            }
            else if (!plain)
            {
                Assert.True(taken == 0, $"row {Escape(row)}: took {taken}, expected the line parser");
            }

            Assert.Equal(DigitRows.TryReadByDigit(shifted, start, out ulong byDigit), taken);
            Assert.Equal(byDigit, value);
        }
    }

    [Fact]
    public void LongRowsGiveTheSameValueByVectorAndByWords()
    {
        // 9-15 digits: the vector steps (where the processor has them) and the two 64-bit words both equal
        // ulong.Parse (the .NET library's parser, the reference), whatever follows the digits.
        var random = new Random(9151);
        for (int n = 0; n < 100_000; n++)
        {
            int digits = random.Next(9, 16);
            byte[] bytes = new byte[24];
            random.NextBytes(bytes);
            for (int i = 0; i < digits; i++)
            {
                bytes[i] = (byte)('0' + random.Next(10));
            }

            bytes[digits] = (byte)'\n';
            ulong expected = ulong.Parse(Encoding.ASCII.GetString(bytes, 0, digits), NumberStyles.None, CultureInfo.InvariantCulture);
            Assert.Equal(expected, DigitRows.LongRowValue(bytes, 0, digits, vector: true));
            Assert.Equal(expected, DigitRows.LongRowValue(bytes, 0, digits, vector: false));
        }
    }

    [Fact]
    public void NearTheBufferEndTakesTheDigitLoopWithoutReadingPastIt()
    {
        byte[] bytes = Encoding.ASCII.GetBytes("123456\n");
        Assert.Equal(7, DigitRows.TryRead(bytes, 0, out ulong value));
        Assert.Equal(123456UL, value);
        Assert.Equal(0, DigitRows.TryRead(Encoding.ASCII.GetBytes("123456"), 0, out _));
    }

    [Fact]
    public void A_run_reads_exactly_the_rows_that_one_at_a_time_reads()
    {
        // Random texts of plain rows with now and then a row the run must leave alone (CRLF, blank, 16-19 digits, a
        // value over the limit, a comment, a letter): reading with runs and single rows, as the text reader does, gives
        // the same rows, line numbers and end position as single rows alone, in batches of every size.
        var random = new Random(424242);
        const ulong limit = 99_999_999_999UL;
        for (int n = 0; n < 400; n++)
        {
            var text = new StringBuilder();
            int rows = random.Next(1, 400);
            for (int r = 0; r < rows; r++)
            {
                int kind = random.Next(100);
                string digits = new string(Enumerable.Range(0, random.Next(1, 12)).Select(_ => (char)('0' + random.Next(10))).ToArray());
                text.Append(kind switch
                {
                    0 => digits + "\r\n",
                    1 => "\n",
                    2 => "1234567890123456" + digits[..Math.Min(3, digits.Length)] + "\n",
                    3 => "999999999999\n", // over the limit
                    4 => "# note\n",
                    5 => digits + "x\n",
                    _ => digits + "\n",
                });
            }

            byte[] bytes = Encoding.ASCII.GetBytes(text.ToString());
            int capacity = random.Next(1, 300);
            Assert.Equal(ReadAll(bytes, limit, capacity, runs: false), ReadAll(bytes, limit, capacity, runs: true));
        }
    }

    /// <summary>The reader's loop: runs (when asked) and single rows until a line neither takes; rows as "line:value" and the end.</summary>
    private static string ReadAll(byte[] bytes, ulong limit, int capacity, bool runs)
    {
        var batch = new CaptureRowBatch(capacity);
        var got = new StringBuilder();
        int p = 0;
        long line = 0;
        int end = bytes.Length;
        while (end - p >= DigitRows.ReadableBytes)
        {
            batch.Clear();
            while (!batch.IsFull && end - p >= DigitRows.ReadableBytes)
            {
                if (runs && DigitRows.ReadRun(bytes, ref p, end, limit, batch, ref line) > 0)
                {
                    continue;
                }

                int taken = DigitRows.TryRead(bytes, p, out ulong value);
                if (taken == 0 || value > limit)
                {
                    goto Done;
                }

                line++;
                batch.AddTick(value, 0, line);
                p += taken;
            }

        Done:
            for (int i = 0; i < batch.Count; i++)
            {
                Assert.Equal(0UL, batch.Counts[i]);
                got.Append(batch.LineNumbers[i]).Append(':').Append(batch.Ticks[i]).Append(' ');
            }

            if (!batch.IsFull)
            {
                break;
            }
        }

        return got.Append("end ").Append(p).ToString();
    }

    /// <summary>The row followed by filler, so that <see cref="DigitRows.ReadableBytes"/> bytes are readable.</summary>
    private static byte[] Padded(string row, Random? random = null)
    {
        byte[] text = Encoding.ASCII.GetBytes(row);
        byte[] bytes = new byte[text.Length + DigitRows.ReadableBytes];
        if (random != null)
        {
            // Digits after a line end, as in a real capture (the next row).
            for (int i = text.Length; i < bytes.Length; i++)
            {
                bytes[i] = (byte)('0' + random.Next(10));
            }
        }

        text.CopyTo(bytes, 0);
        return bytes;
    }

    private static string Escape(string row) => row.Replace("\r", "\\r", StringComparison.Ordinal).Replace("\n", "\\n", StringComparison.Ordinal);
}
