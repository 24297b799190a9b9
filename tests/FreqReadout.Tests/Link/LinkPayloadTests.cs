using FreqReadout.Counting;
using FreqReadout.Detection;
using FreqReadout.Link;
using FreqReadout.Readout;
using FsCheck;
using FsCheck.Fluent;

namespace FreqReadout.Tests.Link;

/// <summary>Every frame type's payload round-trips, and a short or damaged payload is refused, never misread.</summary>
public sealed class LinkPayloadTests
{
    private static LinkPayloadReader ReaderOf(LinkPayloadWriter w)
    {
        var r = new LinkPayloadReader();
        r.Reset(w.Buffer, w.Length);
        return r;
    }

    [Theory]
    // Unsigned LEB128: DWARF Debugging Information Format, version 4 (DWARF Standards Committee, 2010), section 7.6,
    // figure 22 lists 2 = 02, 127 = 7F, 128 = 80 01, 129 = 81 01, 12857 = B9 64; 624485 = E5 8E 26 is the worked
    // example of Wikipedia's "LEB128" article. Both from memory.
    [InlineData(2UL, new byte[] { 0x02 })]
    [InlineData(127UL, new byte[] { 0x7F })]
    [InlineData(128UL, new byte[] { 0x80, 0x01 })]
    [InlineData(129UL, new byte[] { 0x81, 0x01 })]
    [InlineData(12857UL, new byte[] { 0xB9, 0x64 })]
    [InlineData(624485UL, new byte[] { 0xE5, 0x8E, 0x26 })]
    public void Unsigned_leb128_matches_the_published_examples(ulong value, byte[] expected)
    {
        var w = new LinkPayloadWriter();
        w.WriteVarUInt(value);
        Assert.Equal(expected, w.Buffer.AsSpan(0, w.Length).ToArray());
        Assert.Equal(expected.Length, LinkPayloadWriter.VarUIntBytes(value));
        Assert.True(ReaderOf(w).TryReadVarUInt(out ulong back));
        Assert.Equal(value, back);
    }

    [Fact]
    public void Leb128_of_the_largest_value_takes_ten_bytes_and_an_eleventh_byte_is_refused()
    {
        var w = new LinkPayloadWriter();
        w.WriteVarUInt(ulong.MaxValue);
        Assert.Equal(10, w.Length);
        Assert.True(ReaderOf(w).TryReadVarUInt(out ulong back));
        Assert.Equal(ulong.MaxValue, back);

        byte[] tooLong = { 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0x7F };   // 70 bits
        var r = new LinkPayloadReader();
        r.Reset(tooLong, tooLong.Length);
        Assert.False(r.TryReadVarUInt(out _));
        Assert.Equal(tooLong.Length, r.Remaining);
    }

    [Fact]
    public void Fixed_width_fields_are_little_endian_and_doubles_are_their_ieee_bits()
    {
        var w = new LinkPayloadWriter();
        w.WriteUInt16(0x1234);
        w.WriteUInt32(0xA1B2C3D4);
        w.WriteInt64(-2);
        w.WriteDouble(1.0);    // IEEE 754 binary64 of 1.0 is 0x3FF0000000000000 (IEEE 754-2019, 3.4)
        Assert.Equal(new byte[] { 0x34, 0x12, 0xD4, 0xC3, 0xB2, 0xA1, 0xFE, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0xFF, 0, 0, 0, 0, 0, 0, 0xF0, 0x3F }, w.Buffer.AsSpan(0, w.Length).ToArray());
    }

    [Fact]
    public void A_write_that_does_not_fit_marks_the_payload_overflowed()
    {
        var w = new LinkPayloadWriter();
        for (int i = 0; i < LinkFrameEncoder.MaxPayloadBytes / 8; i++)
        {
            w.WriteInt64(i);
        }

        Assert.False(w.Overflowed);
        w.WriteByte(1);
        Assert.True(w.Overflowed);
        Assert.Equal(LinkFrameEncoder.MaxPayloadBytes, w.Length);
        var queue = new FreqReadout.Firmware.Link.LinkSendQueue(4);
        Assert.False(queue.TryEnqueue(LinkFrameType.Status, w));
        Assert.Equal(1, queue.FramesLost);
    }

    [Fact]
    public void Capture_header_round_trips_and_refuses_values_out_of_range()
    {
        var h = new CaptureHeaderPayload { BootId = 0xDEADBEEF, Snapshots = true, ClockHz = 1e6, Prescale = 4, Signal = SignalKind.Beat, BeatSide = BeatSide.Below, SearchHz = 98_765.4 };
        var w = new LinkPayloadWriter();
        h.Write(w);
        Assert.Equal(CaptureHeaderPayload.Bytes, w.Length);
        var back = new CaptureHeaderPayload();
        Assert.True(back.TryRead(ReaderOf(w)));
        Assert.Equal((h.BootId, h.Snapshots, h.ClockHz, h.Prescale, h.TimerBits, h.CountBits, h.Signal, h.BeatSide, h.SearchHz),
            (back.BootId, back.Snapshots, back.ClockHz, back.Prescale, back.TimerBits, back.CountBits, back.Signal, back.BeatSide, back.SearchHz));

        w.Buffer[4 + 1 + 8 + 4] = 12;    // timer bits 12
        Assert.False(new CaptureHeaderPayload().TryRead(ReaderOf(w)));
        for (int cut = 0; cut < CaptureHeaderPayload.Bytes; cut++)
        {
            var r = new LinkPayloadReader();
            r.Reset(w.Buffer, cut);
            Assert.False(new CaptureHeaderPayload().TryRead(r));
        }
    }

    [Fact]
    public void Reading_event_temperature_status_and_request_round_trip()
    {
        var w = new LinkPayloadWriter();
        var reading = new ReadingPayload
        {
            TimeSeconds = 12.3, State = ReadoutState.Target, Class = TargetClass.NonFerrous, HasFrequency = true, HasShift = true, HasPpm = true,
            TargetPresent = true, BelowBeatFloor = true, FrequencyHz = 100_012.5, BaselineHz = 100_000.25, ShiftHz = 12.25, ShiftPpm = 122.5,
            ShiftSigma = 40.5, NoiseHz = 0.3, DriftHzPerSecond = -0.01,
        };
        reading.Write(w);
        Assert.Equal(ReadingPayload.Bytes, w.Length);
        var r2 = new ReadingPayload();
        Assert.True(r2.TryRead(ReaderOf(w)));
        Assert.Equivalent(reading, r2, strict: true);

        w.Reset();
        var ev = new EventPayload { StartSeconds = 1, EndSeconds = 2, PeakSeconds = 1.5, PeakShiftHz = -3.5, PeakShiftPpm = -35, PeakSigma = -11, NoiseHz = 0.3, Class = TargetClass.Ferrous, End = EventEnd.Resolved, HasPpm = true, MixedSign = true };
        ev.Write(w);
        Assert.Equal(EventPayload.Bytes, w.Length);
        var e2 = new EventPayload();
        Assert.True(e2.TryRead(ReaderOf(w)));
        Assert.Equivalent(ev, e2, strict: true);

        w.Reset();
        var t = new TemperaturePayload { Tick = 123_456_789_012, TemperatureC = 21.75 };
        t.Write(w);
        var t2 = new TemperaturePayload();
        Assert.True(t2.TryRead(ReaderOf(w)));
        Assert.Equivalent(t, t2, strict: true);

        w.Reset();
        var s = new StatusPayload { BootId = 7, UptimeMicroseconds = 3_600_000_000, Reads = 3_600_000, ReadsDropped = 2, WrapsMended = 55, Stalls = 3, LongestGapMicroseconds = 41_000, MissedDeadlines = 12, FramesLost = 4, RejectedTicks = 1, SettingsCheck = 0xCBF43926, SettingsProblems = 2, HoldActive = true };
        s.Write(w);
        Assert.Equal(StatusPayload.Bytes, w.Length);
        var s2 = new StatusPayload();
        Assert.True(s2.TryRead(ReaderOf(w)));
        Assert.Equivalent(s, s2, strict: true);

        w.Reset();
        new RequestPayload { WantedType = LinkFrameType.CaptureHeader }.Write(w);
        var q = new RequestPayload();
        Assert.True(q.TryRead(ReaderOf(w)));
        Assert.Equal(LinkFrameType.CaptureHeader, q.WantedType);
        w.Buffer[0] = LinkFrameType.SnapshotBatch;    // not a type a device sends on request
        Assert.False(new RequestPayload().TryRead(ReaderOf(w)));
    }

    [Fact]
    public void Fixed_layouts_ignore_bytes_appended_by_a_later_version()
    {
        var w = new LinkPayloadWriter();
        new TemperaturePayload { Tick = 5, TemperatureC = 20 }.Write(w);
        w.WriteUInt32(0xFFFFFFFF);    // a field a later version might append
        var t = new TemperaturePayload();
        Assert.True(t.TryRead(ReaderOf(w)));
        Assert.Equal(20, t.TemperatureC);
    }

    [Fact]
    public void A_snapshot_batch_refuses_a_read_that_goes_back_and_stops_at_the_payload_limit()
    {
        var b = new SnapshotBatchPayload();
        Assert.True(b.TryAdd(1000, 50));
        Assert.False(b.TryAdd(1000, 60));      // same tick
        Assert.False(b.TryAdd(2000, 49));      // count went back
        Assert.True(b.TryAdd(2000, 50));       // count may stay (no signal)

        // Huge steps (10-byte deltas) fill the 240-byte payload before MaxRows.
        b.Clear();
        long tick = 0;
        long count = 0;
        int rows = 0;
        while (b.TryAdd(tick, count))
        {
            rows++;
            tick += long.MaxValue / 1000;
            count += long.MaxValue / 1000;
        }

        Assert.True(rows < SnapshotBatchPayload.MaxRows, "rows: " + rows);
        Assert.True(b.EncodedBytes <= LinkFrameEncoder.MaxPayloadBytes);
        var w = new LinkPayloadWriter();
        b.Write(w);
        Assert.False(w.Overflowed);
        Assert.Equal(b.EncodedBytes, w.Length);
    }

    [Fact]
    public void Snapshot_batches_round_trip_for_any_increasing_reads()
    {
        Prop.ForAll(
            Gen.Choose(1, 200).SelectMany(n => Gen.ArrayOf(Gen.Choose(1, 5_000_000).Zip(Gen.Choose(0, 100_000)), n)).ToArbitrary(),
            Gen.Choose(0, int.MaxValue).ToArbitrary(),
            (steps, start) =>
            {
                var batch = new SnapshotBatchPayload();
                var back = new SnapshotBatchPayload();
                var w = new LinkPayloadWriter();
                long tick = start;
                long count = start / 3;
                var expected = new List<(long, long)>();
                var got = new List<(long, long)>();
                void Flush()
                {
                    w.Reset();
                    batch.Write(w);
                    Assert.Equal(batch.EncodedBytes, w.Length);
                    Assert.True(back.TryRead(ReaderOf(w)));
                    for (int i = 0; i < back.Count; i++)
                    {
                        got.Add((back.TickAt(i), back.CountAt(i)));
                    }

                    batch.Clear();
                }

                foreach ((int dt, int dc) in steps)
                {
                    tick += dt;
                    count += dc;
                    expected.Add((tick, count));
                    if (!batch.TryAdd(tick, count))
                    {
                        Flush();
                        Assert.True(batch.TryAdd(tick, count));
                    }
                }

                Flush();
                return expected.SequenceEqual(got);
            }).QuickCheckThrowOnFailure();
    }

    [Fact]
    public void Edge_batches_round_trip_and_a_zero_step_is_refused_on_reading()
    {
        var b = new EdgeBatchPayload();
        long[] ticks = { 10, 11, 200, 70_000, 70_001, 1L << 40 };
        foreach (long t in ticks)
        {
            Assert.True(b.TryAdd(t));
        }

        var w = new LinkPayloadWriter();
        b.Write(w);
        var back = new EdgeBatchPayload();
        Assert.True(back.TryRead(ReaderOf(w)));
        Assert.Equal(ticks, Enumerable.Range(0, back.Count).Select(back.TickAt));

        w.Reset();
        w.WriteByte(2);
        w.WriteInt64(5);
        w.WriteVarUInt(0);
        Assert.False(new EdgeBatchPayload().TryRead(ReaderOf(w)));
    }

    [Fact]
    public void The_protocol_page_states_each_fixed_payload_size_the_code_writes()
    {
        string page = File.ReadAllText(Path.Combine(FreqReadout.Tests.Docs.CliProcess.RepoRoot(), "docs", "link-protocol.md"));
        var stated = System.Text.RegularExpressions.Regex.Matches(page, @"^### (\d) [a-z ]+ \((\d+) bytes\)$", System.Text.RegularExpressions.RegexOptions.Multiline)
            .ToDictionary(m => int.Parse(m.Groups[1].Value), m => int.Parse(m.Groups[2].Value));
        var w = new LinkPayloadWriter();
        int Size(Action<LinkPayloadWriter> write)
        {
            w.Reset();
            write(w);
            return w.Length;
        }

        Assert.Equal(new Dictionary<int, int>
        {
            [LinkFrameType.CaptureHeader] = Size(new CaptureHeaderPayload().Write),
            [LinkFrameType.Reading] = Size(new ReadingPayload().Write),
            [LinkFrameType.Event] = Size(new EventPayload().Write),
            [LinkFrameType.Temperature] = Size(new TemperaturePayload().Write),
            [LinkFrameType.Status] = Size(new StatusPayload().Write),
        }, stated);
    }
}
