using FreqReadout.Counting;
using FreqReadout.Host.Captures;
using FsCheck;
using FsCheck.Fluent;
using FsCheck.Xunit;

namespace FreqReadout.Tests.Robustness;

/// <summary>
/// Property: a random capture within the format contract (any kind, timer and count width, clock,
/// prescale, signal and beat side, optional temp_c and mark columns, ticks increasing with wraps)
/// written as text, converted to binary and back to text keeps every row and every metadata field,
/// and the final text is byte for byte the first one.
/// </summary>
public sealed class CaptureRoundTripProperties
{
    /// <summary>A generated capture: metadata plus rows (ticks already wrapped to the timer width).</summary>
    public sealed record CaptureCase(CaptureMetadata Metadata, IReadOnlyList<CaptureRow> Rows)
    {
        public override string ToString() =>
            $"{Metadata.Kind} clock={Metadata.ClockHz:R} prescale={Metadata.Prescale} timer_bits={Metadata.TimerBits} count_bits={Metadata.CountBits} " +
            $"signal={Metadata.Signal} side={Metadata.BeatSide} columns=[{string.Join(",", Metadata.ExtraColumns)}] rows={Rows.Count}" +
            (Rows.Count > 0 ? $" first tick={Rows[0].Tick}" : string.Empty);
    }

    private static readonly string[] Marks = { "rebaseline", "hold", "release", "stone edge", "pass 3 é" };

    private static Gen<CaptureMetadata> MetadataGen() =>
        from kind in Gen.Elements(CaptureKind.Edges, CaptureKind.Snapshots)
        from timerBits in Gen.Elements(16, 24, 32, 64)
        from countBits in Gen.Elements(16, 24, 32, 64)
        from clockInt in Gen.Choose(1, 100_000_000)
        from clockFrac in Gen.Choose(0, 999_999)
        from wholeClock in Gen.Elements(true, false)
        from prescale in Gen.Choose(1, 4096)
        from beat in Gen.Choose(0, 2)
        from temp in Gen.Elements(true, false)
        from mark in Gen.Elements(true, false)
        from markFirst in Gen.Elements(true, false)
        select Build(kind, timerBits, countBits, wholeClock ? clockInt : clockInt + (clockFrac / 1e6), prescale, beat, temp, mark, markFirst);

    private static CaptureMetadata Build(CaptureKind kind, int timerBits, int countBits, double clockHz, int prescale, int beat, bool temp, bool mark, bool markFirst)
    {
        var md = new CaptureMetadata { Kind = kind, TimerBits = timerBits, CountBits = countBits, ClockHz = clockHz, Prescale = prescale };
        if (beat > 0)
        {
            md.Signal = SignalKind.Beat;
            md.BeatSide = beat == 1 ? BeatSide.Above : BeatSide.Below;
        }

        if (temp)
        {
            md.ExtraColumns.Add(CaptureColumns.TemperatureC);
        }

        if (mark)
        {
            md.ExtraColumns.Insert(markFirst ? 0 : md.ExtraColumns.Count, CaptureColumns.Mark);
        }

        return md;
    }

    /// <summary>One row's random parts: tick step, count step, temperature (or none), mark index (or none).</summary>
    private static Gen<(int Step, int CountStep, int? TempMilli, int? Mark)> RowGen() =>
        from step in Gen.Frequency((3, Gen.Choose(1, 300)), (1, Gen.Choose(1, 1 << 22)))
        from countStep in Gen.Choose(0, 5000)
        from hasTemp in Gen.Frequency((1, Gen.Constant(true)), (4, Gen.Constant(false)))
        from tempMilli in Gen.Choose(-273_150, 999_999)
        from hasMark in Gen.Frequency((1, Gen.Constant(true)), (9, Gen.Constant(false)))
        from mark in Gen.Choose(0, Marks.Length - 1)
        select (step, countStep, hasTemp ? tempMilli : (int?)null, hasMark ? mark : (int?)null);

    private static Gen<CaptureCase> CaseGen() =>
        from md in MetadataGen()
        from startHi in Gen.Choose(0, int.MaxValue)
        from startLo in Gen.Choose(0, int.MaxValue)
        from parts in Gen.ListOf(RowGen())
        select MakeCase(md, ((ulong)startHi << 31) | (uint)startLo, parts);

    private static CaptureCase MakeCase(CaptureMetadata md, ulong start, IEnumerable<(int Step, int CountStep, int? TempMilli, int? Mark)> parts)
    {
        ulong tickMask = md.TimerBits == 64 ? ulong.MaxValue : (1UL << md.TimerBits) - 1;
        ulong countMask = md.CountBits == 64 ? ulong.MaxValue : (1UL << md.CountBits) - 1;
        ulong tick = start & tickMask;
        ulong count = (start >> 7) & countMask;
        var rows = new List<CaptureRow>();
        foreach (var p in parts)
        {
            // Steps stay below one wrap of the narrowest timer, so the ticks increase once unwrapped.
            tick = (tick + (ulong)Math.Min(p.Step, (long)(tickMask / 2))) & tickMask;
            if (md.Kind == CaptureKind.Snapshots)
            {
                count = (count + (ulong)p.CountStep) & countMask;
            }

            // Temperatures with a fraction that is not a short decimal, so the round trip must keep every bit.
            double? temp = md.HasTemperatureColumn && p.TempMilli is int t ? t / 1000.0 + (t % 7) * 1e-9 / 3 : null;
            string? mark = md.HasMarkColumn && p.Mark is int m ? Marks[m] : null;
            rows.Add(new CaptureRow(0, tick, md.Kind == CaptureKind.Snapshots ? count : 0, temp, mark));
        }

        return new CaptureCase(md, rows);
    }

    private static byte[] Write(CaptureMetadata md, IEnumerable<CaptureRow> rows, CaptureFileFormat format)
    {
        var stream = new MemoryStream();
        using (var writer = CaptureFile.Create(stream, md, format))
        {
            foreach (var row in rows)
            {
                writer.WriteRow(row);
            }

            writer.Complete(Array.Empty<KeyValuePair<string, string>>());
        }

        return stream.ToArray();
    }

    private static (CaptureMetadata Metadata, List<CaptureRow> Rows) Read(byte[] bytes)
    {
        using var reader = CaptureFile.Open(new MemoryStream(bytes), "property");
        var rows = reader.ReadRows().ToList();
        return (reader.Metadata, rows);
    }

    private static void AssertSame(CaptureCase expected, CaptureMetadata md, IReadOnlyList<CaptureRow> rows)
    {
        Assert.Equal(expected.Metadata.ClockHz, md.ClockHz);
        Assert.Equal(
            (expected.Metadata.Kind, expected.Metadata.Prescale, expected.Metadata.TimerBits, expected.Metadata.CountBits, expected.Metadata.Signal, expected.Metadata.BeatSide),
            (md.Kind, md.Prescale, md.TimerBits, md.CountBits, md.Signal, md.BeatSide));
        Assert.Equal(expected.Metadata.ExtraColumns, md.ExtraColumns);
        Assert.Equal(expected.Rows.Count, rows.Count);
        for (int i = 0; i < rows.Count; i++)
        {
            var e = expected.Rows[i];
            var g = rows[i];
            Assert.Equal((e.Tick, e.Count, e.TemperatureC, e.Mark), (g.Tick, g.Count, g.TemperatureC, g.Mark));
        }
    }

    [Property(MaxTest = 200)]
    public Property Text_to_binary_to_text_is_lossless() =>
        Prop.ForAll(CaseGen().ToArbitrary(), c =>
        {
            byte[] text = Write(c.Metadata, c.Rows, CaptureFileFormat.Text);
            var fromText = Read(text);
            AssertSame(c, fromText.Metadata, fromText.Rows);

            byte[] binary = Write(fromText.Metadata, fromText.Rows, CaptureFileFormat.Binary);
            Assert.Equal(CaptureFileFormat.Binary, DetectFormat(binary));
            var fromBinary = Read(binary);
            AssertSame(c, fromBinary.Metadata, fromBinary.Rows);

            byte[] textAgain = Write(fromBinary.Metadata, fromBinary.Rows, CaptureFileFormat.Text);
            Assert.Equal(text, textAgain);
        });

    private static CaptureFileFormat DetectFormat(byte[] bytes) =>
        bytes.AsSpan().StartsWith(BinaryCaptureFormat.Magic) ? CaptureFileFormat.Binary : CaptureFileFormat.Text;
}
