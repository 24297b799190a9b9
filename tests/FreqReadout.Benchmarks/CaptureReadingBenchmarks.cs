using System.Text;
using BenchmarkDotNet.Attributes;
using FreqReadout.Host.Captures;

namespace FreqReadout.Benchmarks;

/// <summary>
/// Capture reading, per row: the text format (UTF-8, one tick per line, the contract of docs/capture-text-format.md) and
/// the binary format (delta-encoded blocks with CRC-32), both from memory so the disk is not timed;
/// 1 000 000 rows of a 100 kHz signal on an 80 MHz, 32-bit timer (about 9 digits per tick).
/// Run: dotnet run -c Release --project tests/FreqReadout.Benchmarks -- --filter '*CaptureReading*' --job short
/// </summary>
[MemoryDiagnoser]
public class CaptureReadingBenchmarks
{
    private const int Rows = 1_000_000;
    private byte[] _text = Array.Empty<byte>();
    private byte[] _binary = Array.Empty<byte>();

    [GlobalSetup]
    public void Setup()
    {
        var sb = new StringBuilder(Rows * 11);
        sb.Append("# freqreadout capture 1\n# clock_hz = 80000000\n# timer_bits = 32\n# search_hz = 100000\ntick\n");
        var rng = new Random(3);
        double t = 4_000_000_000.0;
        for (int k = 0; k < Rows; k++)
        {
            sb.Append(((ulong)(t + rng.Next(-2, 3)) & 0xFFFFFFFFUL).ToString(System.Globalization.CultureInfo.InvariantCulture)).Append('\n');
            t += 800.0;
        }

        _text = Encoding.UTF8.GetBytes(sb.ToString());
        using var reader = new TextCaptureReader(new MemoryStream(_text), "bench.csv");
        var output = new MemoryStream();
        using (var writer = new BinaryCaptureWriter(output, reader.Metadata, leaveOpen: true))
        {
            foreach (var row in reader.ReadRows())
            {
                writer.WriteRow(row);
            }

            writer.Complete(reader.Trailer);
        }

        _binary = output.ToArray();
    }

    [Benchmark(OperationsPerInvoke = Rows)]
    public ulong TextRowsRead()
    {
        using var reader = new TextCaptureReader(new MemoryStream(_text), "bench.csv");
        ulong sum = 0;
        foreach (var row in reader.ReadRows())
        {
            sum += row.Tick;
        }

        return sum;
    }

    [Benchmark(OperationsPerInvoke = Rows)]
    public ulong BinaryRowsRead()
    {
        using var reader = new BinaryCaptureReader(new MemoryStream(_binary), "bench.frcap");
        ulong sum = 0;
        foreach (var row in reader.ReadRows())
        {
            sum += row.Tick;
        }

        return sum;
    }

    [Benchmark(OperationsPerInvoke = Rows)]
    public ulong TextRowsReadLineBased()
    {
        using var reader = TextCaptureReader.OpenLineBased(new MemoryStream(_text), "bench.csv");
        ulong sum = 0;
        foreach (var row in reader.ReadRows())
        {
            sum += row.Tick;
        }

        return sum;
    }

    [Benchmark(OperationsPerInvoke = Rows)]
    public ulong TextBatchesRead()
    {
        using var reader = new TextCaptureReader(new MemoryStream(_text), "bench.csv");
        return SumBatches(reader);
    }

    [Benchmark(OperationsPerInvoke = Rows)]
    public ulong BinaryBatchesRead()
    {
        using var reader = new BinaryCaptureReader(new MemoryStream(_binary), "bench.frcap");
        return SumBatches(reader);
    }

    /// <summary>Only the digits-only rows' parse (<see cref="DigitRows.TryRead"/>), over the rows after the header.</summary>
    [Benchmark(OperationsPerInvoke = Rows)]
    public ulong DigitRowsParsed() => SumDigitRows(vector: true);

    /// <summary>The same rows parsed one digit at a time (<see cref="DigitRows.TryReadByDigit"/>), the loop it replaced.</summary>
    [Benchmark(OperationsPerInvoke = Rows)]
    public ulong DigitRowsParsedByDigit() => SumDigitRows(vector: false);

    /// <summary>The same rows read in runs (<see cref="DigitRows.ReadRun"/>, 64 bytes at a time) into a reused batch.</summary>
    [Benchmark(OperationsPerInvoke = Rows)]
    public ulong DigitRowsReadInRuns()
    {
        byte[] text = _text;
        int p = Encoding.ASCII.GetBytes("# freqreadout capture 1\n# clock_hz = 80000000\n# timer_bits = 32\n# search_hz = 100000\ntick\n").Length;
        var batch = _runBatch;
        long line = 5;
        ulong sum = 0;
        while (true)
        {
            batch.Clear();
            if (DigitRows.ReadRun(text, ref p, text.Length, ulong.MaxValue, batch, ref line) == 0)
            {
                return sum;
            }

            sum += batch.Ticks[batch.Count - 1];
        }
    }

    private readonly CaptureRowBatch _runBatch = new();

    private ulong SumDigitRows(bool vector)
    {
        byte[] text = _text;
        int p = Encoding.ASCII.GetBytes("# freqreadout capture 1\n# clock_hz = 80000000\n# timer_bits = 32\n# search_hz = 100000\ntick\n").Length;
        int last = text.Length - DigitRows.ReadableBytes;
        ulong sum = 0;
        while (p <= last)
        {
            int taken = vector ? DigitRows.TryRead(text, p, out ulong value) : DigitRows.TryReadByDigit(text, p, out value);
            if (taken == 0)
            {
                break;
            }

            sum += value;
            p += taken;
        }

        return sum;
    }

    private static ulong SumBatches(ICaptureBatchReader reader)
    {
        var batch = new CaptureRowBatch();
        ulong sum = 0;
        while (reader.ReadBatch(batch))
        {
            for (int i = 0; i < batch.Count; i++)
            {
                sum += batch.Ticks[i];
            }
        }

        return sum;
    }
}
