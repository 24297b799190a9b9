using FreqReadout.Host.Captures;

namespace FreqReadout.Tests.Captures;

/// <summary>Readers stream: rows come out while the input is still being produced, never all held at once.</summary>
public sealed class CaptureStreamingTests
{
    private const long Rows = 3_000_000;

    /// <summary>Read-ahead a reader may hold beyond the current row (its decode buffers: the text reader reads 1 MiB blocks), bytes.</summary>
    private const long ReadAheadBytes = Utf8LineReader.BufferBytes + (512 * 1024);

    [Fact]
    public void Text_reader_streams_a_multi_million_row_capture_produced_lazily()
    {
        var source = new GeneratedCaptureStream(Rows);
        using var reader = CaptureFile.Open(source, "generated.csv");
        Assert.True(source.BytesProduced < ReadAheadBytes, "opening reads only the header and a buffer");
        long n = 0;
        foreach (var row in reader.ReadRows())
        {
            if (row.Tick != GeneratedCaptureStream.TickOf(n))
            {
                Assert.Fail($"row {n}: tick {row.Tick}, expected {GeneratedCaptureStream.TickOf(n)}");
            }

            if (n % 100_000 == 0)
            {
                // The reader has pulled at most the rows so far plus its read-ahead: rows are yielded lazily.
                long bound = source.HeaderBytes + (n + 1) * GeneratedCaptureStream.MaxRowBytes + ReadAheadBytes;
                Assert.True(source.BytesProduced <= bound, $"at row {n} the reader had pulled {source.BytesProduced} bytes (bound {bound})");
                Assert.Equal(-12.5, row.TemperatureC);
            }

            n++;
        }

        Assert.Equal(Rows, n);
        Assert.True(source.BytesProduced > 25_000_000, "the whole capture went through the reader");
    }
}
