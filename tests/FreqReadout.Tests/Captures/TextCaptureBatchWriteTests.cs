using System.Text;
using FreqReadout.Host.Captures;

namespace FreqReadout.Tests.Captures;

/// <summary>Batched edge rows (<see cref="IEdgeBatchWriter"/>) give the same text and the same errors as row by row.</summary>
public class TextCaptureBatchWriteTests
{
    private static CaptureMetadata Metadata(int timerBits, params string[] extraColumns)
    {
        var md = new CaptureMetadata { ClockHz = 80e6, Prescale = 32, TimerBits = timerBits, SearchHz = 100_000 };
        md.ExtraColumns.AddRange(extraColumns);
        return md;
    }

    /// <summary>Rows with a temperature on every 7th (values that need the long "R" form too), ticks up to 2^32 - 1 and 0.</summary>
    private static (ulong[] Ticks, double[] Temperatures) Rows(int n)
    {
        var ticks = new ulong[n];
        var temps = new double[n];
        var random = new Random(5);
        ulong tick = 4_294_000_000UL;
        for (int i = 0; i < n; i++)
        {
            tick = (tick + (ulong)random.Next(1, 30_000)) & 0xFFFF_FFFFUL;
            ticks[i] = i == 3 ? 0 : i == 4 ? 0xFFFF_FFFFUL : tick;
            temps[i] = i % 7 == 0 ? Math.Round(-40 + (random.NextDouble() * 100), i % 3) + (i % 5 == 0 ? 1e-7 : 0) : double.NaN;
        }

        return (ticks, temps);
    }

    private static string RowByRow(CaptureMetadata md, ulong[] ticks, double[] temps)
    {
        var stream = new MemoryStream();
        using (var w = new TextCaptureWriter(stream, md, leaveOpen: true))
        {
            for (int i = 0; i < ticks.Length; i++)
            {
                w.WriteRow(new CaptureRow(i + 1, ticks[i], 0, double.IsNaN(temps[i]) ? null : temps[i], null));
            }

            w.Complete(new[] { new KeyValuePair<string, string>("simulated_rows", ticks.Length.ToString()) });
        }

        return Encoding.UTF8.GetString(stream.ToArray());
    }

    [Theory]
    [InlineData("")]
    [InlineData("temp_c")]
    [InlineData("mark,temp_c")]
    public void Batches_MixedWithSingleRows_AreByteIdenticalToRowByRow(string columnList)
    {
        string[] columns = columnList.Split(',', StringSplitOptions.RemoveEmptyEntries);
        var md = Metadata(32, columns);
        var (ticks, temps) = Rows(20_000);
        if (columns.Length == 0)
        {
            Array.Fill(temps, double.NaN);
        }

        string expected = RowByRow(md, ticks, temps);
        var stream = new MemoryStream();
        using (var w = new TextCaptureWriter(stream, md, leaveOpen: true))
        {
            // Batches of uneven sizes (one larger than the 64 KiB byte buffer holds), with single rows in between.
            int i = 0;
            int[] sizes = { 1, 0, 13, 9000, 1, 4096, 3 };
            int s = 0;
            while (i < ticks.Length)
            {
                int size = Math.Min(sizes[s++ % sizes.Length], ticks.Length - i);
                w.WriteEdges(ticks.AsSpan(i, size), temps.AsSpan(i, size), i + 1);
                i += size;
                if (i < ticks.Length)
                {
                    w.WriteRow(new CaptureRow(i + 1, ticks[i], 0, double.IsNaN(temps[i]) ? null : temps[i], null));
                    i++;
                }
            }

            w.Complete(new[] { new KeyValuePair<string, string>("simulated_rows", ticks.Length.ToString()) });
        }

        Assert.Equal(expected, Encoding.UTF8.GetString(stream.ToArray()));
    }

    [Fact]
    public void OnATextWriter_BatchesFallBackToRows()
    {
        var md = Metadata(32, "temp_c");
        var (ticks, temps) = Rows(500);
        var text = new StringWriter();
        using (var w = new TextCaptureWriter(text, md))
        {
            w.WriteEdges(ticks, temps, 1);
            w.Complete(new[] { new KeyValuePair<string, string>("simulated_rows", "500") });
        }

        Assert.Equal(RowByRow(md, ticks, temps), text.ToString());
    }

    [Fact]
    public void BadRowsInABatch_FailAsRowByRow_AfterWritingTheRowsBefore()
    {
        // A tick above timer_bits: same message as WriteRow, and the rows before it are in the output.
        var md = Metadata(16);
        ulong[] ticks = { 10, 20, 70_000, 30 };
        double[] none = { double.NaN, double.NaN, double.NaN, double.NaN };
        var stream = new MemoryStream();
        var w = new TextCaptureWriter(stream, md, leaveOpen: true);
        var batch = Assert.Throws<ArgumentException>(() => w.WriteEdges(ticks, none, 1));
        var single = Assert.Throws<ArgumentException>(() => new TextCaptureWriter(new MemoryStream(), md).WriteRow(new CaptureRow(3, 70_000, 0, null, null)));
        Assert.Equal(single.Message, batch.Message);
        w.Dispose();
        string text = Encoding.UTF8.GetString(stream.ToArray());
        Assert.EndsWith("tick\n10\n20\n", text);

        // A temperature without a temp_c column, and one out of range.
        Assert.Throws<ArgumentException>(() => new TextCaptureWriter(new MemoryStream(), md).WriteEdges(new ulong[] { 1 }, new[] { 20.0 }, 1));
        var withTemp = Metadata(32, "temp_c");
        var hot = Assert.Throws<ArgumentException>(() => new TextCaptureWriter(new MemoryStream(), withTemp).WriteEdges(new ulong[] { 1 }, new[] { 5000.0 }, 1));
        Assert.Contains("above 1000 deg C", hot.Message);

        // 64-bit timer: ticks must increase, across batches too, naming the earlier row.
        var wide = Metadata(64);
        var w64 = new TextCaptureWriter(new MemoryStream(), wide);
        w64.WriteEdges(new ulong[] { 5, 9 }, new[] { double.NaN, double.NaN }, 1);
        var order = Assert.Throws<ArgumentException>(() => w64.WriteEdges(new ulong[] { 9 }, new[] { double.NaN }, 3));
        Assert.Contains("expected a tick greater than 9 (row 2)", order.Message);

        // Spans of different lengths, and rows after Complete.
        Assert.Throws<ArgumentException>(() => w64.WriteEdges(new ulong[] { 20 }, Array.Empty<double>(), 3));
        w64.Complete(Array.Empty<KeyValuePair<string, string>>());
        Assert.Throws<InvalidOperationException>(() => w64.WriteEdges(new ulong[] { 20 }, new[] { double.NaN }, 3));
    }
}
