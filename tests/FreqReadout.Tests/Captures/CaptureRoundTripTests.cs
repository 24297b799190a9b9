using FreqReadout.Counting;
using FreqReadout.Host.Captures;

namespace FreqReadout.Tests.Captures;

/// <summary>Random captures of every shape survive text and binary round trips unchanged.</summary>
public sealed class CaptureRoundTripTests
{
    public static TheoryData<int> Seeds()
    {
        var data = new TheoryData<int>();
        for (int seed = 1; seed <= 40; seed++)
        {
            data.Add(seed);
        }

        return data;
    }

    [Theory]
    [MemberData(nameof(Seeds))]
    public void Random_captures_round_trip_through_both_formats(int seed)
    {
        var rng = new Random(seed);
        int[] widths = { 16, 24, 32, 64 };
        var md = new CaptureMetadata
        {
            ClockHz = rng.Next(2) == 0 ? rng.Next(1, 100_000_000) : rng.NextDouble() * 1e8 + 1e-3,
            Kind = rng.Next(2) == 0 ? CaptureKind.Edges : CaptureKind.Snapshots,
            Prescale = rng.Next(1, 300),
            TimerBits = widths[rng.Next(4)],
            CountBits = widths[rng.Next(4)],
        };
        if (rng.Next(2) == 0)
        {
            md.Signal = SignalKind.Beat;
            md.BeatSide = rng.Next(2) == 0 ? BeatSide.Above : BeatSide.Below;
        }

        if (rng.Next(2) == 0)
        {
            md.ExtraColumns.Add("temp_c");
        }

        if (rng.Next(2) == 0)
        {
            md.ExtraColumns.Insert(rng.Next(md.ExtraColumns.Count + 1), "mark");
        }

        if (rng.Next(2) == 0)
        {
            md.Extra.Add(new("k" + rng.Next(1000), "v = " + rng.Next()));
        }

        ulong tickMask = md.TimerBits == 64 ? ulong.MaxValue : (1UL << md.TimerBits) - 1;
        ulong countMask = md.CountBits == 64 ? ulong.MaxValue : (1UL << md.CountBits) - 1;
        ulong tick = (ulong)rng.NextInt64() & tickMask & 0x0FFF_FFFF_FFFF_FFFF;
        ulong count = (ulong)rng.NextInt64() & countMask & 0x0FFF_FFFF_FFFF_FFFF;
        var rows = new List<CaptureRow>();
        int n = rng.Next(0, 9000);
        for (int i = 0; i < n; i++)
        {
            tick = (tick + (ulong)rng.Next(1, rng.Next(2) == 0 ? 100 : 1 << 20)) & tickMask;
            if (md.Kind == CaptureKind.Snapshots)
            {
                count = (count + (ulong)rng.Next(0, 5000)) & countMask;
            }

            double? temp = md.HasTemperatureColumn && rng.Next(10) == 0 ? BitConverter.Int64BitsToDouble(rng.NextInt64()) : null;
            if (temp is double t && (!double.IsFinite(t) || t < -273.15 || t > 1000))
            {
                temp = rng.NextDouble() * 200 - 100;
            }

            string? mark = md.HasMarkColumn && rng.Next(50) == 0 ? (rng.Next(3) == 0 ? "hold" : "mark " + rng.Next() + " é") : null;
            rows.Add(new CaptureRow(0, tick, md.Kind == CaptureKind.Snapshots ? count : 0, temp, mark));
        }

        var trailer = rng.Next(2) == 0 ? new[] { new KeyValuePair<string, string>("frames_lost", rng.Next().ToString()) } : Array.Empty<KeyValuePair<string, string>>();
        foreach (var format in new[] { CaptureFileFormat.Text, CaptureFileFormat.Binary })
        {
            var stream = new MemoryStream();
            using (var writer = CaptureFile.Create(stream, md, format))
            {
                foreach (var row in rows)
                {
                    writer.WriteRow(row);
                }

                writer.Complete(trailer);
            }

            using var reader = CaptureFile.Open(new MemoryStream(stream.ToArray()), "random");
            Assert.Equal(md.ClockHz, reader.Metadata.ClockHz);
            Assert.Equal((md.Kind, md.Prescale, md.TimerBits, md.CountBits, md.Signal, md.BeatSide), (reader.Metadata.Kind, reader.Metadata.Prescale, reader.Metadata.TimerBits, reader.Metadata.CountBits, reader.Metadata.Signal, reader.Metadata.BeatSide));
            Assert.Equal(md.Extra, reader.Metadata.Extra);
            Assert.Equal(md.ExtraColumns, reader.Metadata.ExtraColumns);
            var back = reader.ReadRows().ToList();
            Assert.Equal(rows.Count, back.Count);
            for (int i = 0; i < rows.Count; i++)
            {
                Assert.Equal((rows[i].Tick, rows[i].Count, rows[i].TemperatureC, rows[i].Mark), (back[i].Tick, back[i].Count, back[i].TemperatureC, back[i].Mark));
            }

            Assert.Equal(trailer, reader.Trailer);
        }
    }
}
