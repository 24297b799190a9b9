using FreqReadout.Link;

namespace FreqReadout.Tests.Link;

/// <summary>
/// The link's frame envelope (docs/link-protocol.md): every frame written is read back whole, and a stream with faults
/// injected (bit flips, dropped and duplicated bytes, truncated frames, garbage between frames) delivers every intact
/// frame, delivers nothing that was not sent, and counts what it dropped. Seeded random frames and faults, invented
/// data; deterministic, so a pass is a pass every run.
/// </summary>
public class LinkFrameTests
{
    [Fact]
    public void Every_payload_length_and_type_round_trips_and_the_whole_frame_checks_to_zero()
    {
        var encoder = new LinkFrameEncoder();
        var decoder = new LinkFrameDecoder();
        var frame = new LinkFrame();
        var random = new Random(11);
        var wire = new byte[LinkFrameEncoder.MaxWireBytes];
        for (int length = 0; length <= LinkFrameEncoder.MaxPayloadBytes; length++)
        {
            byte[] payload = new byte[length];
            random.NextBytes(payload);
            int type = 1 + (length % 255);
            Assert.True(encoder.TryEncode(type, payload, 0, length, wire, 0, out int written));
            Assert.InRange(written, length + 8, LinkFrameEncoder.MaxWireBytes);
            Assert.Equal(0, wire[written - 1]);
            Assert.DoesNotContain((byte)0, wire.Take(written - 1));

            int delivered = 0;
            for (int i = 0; i < written; i++)
            {
                if (decoder.Push(wire[i], frame))
                {
                    delivered++;
                }
            }

            Assert.Equal(1, delivered);
            Assert.Equal(type, frame.FrameType);
            Assert.Equal(length & 0xFFFF, frame.Sequence);
            Assert.Equal(LinkFrameEncoder.Version, frame.Version);
            Assert.Equal(payload, frame.Payload.Take(frame.PayloadLength).ToArray());
        }

        Assert.Equal(0, decoder.CrcErrors + decoder.Malformed + decoder.SequenceGaps);
    }

    [Fact]
    public void What_cannot_be_a_frame_is_refused_by_the_encoder()
    {
        var encoder = new LinkFrameEncoder();
        var wire = new byte[LinkFrameEncoder.MaxWireBytes + 8];
        Assert.False(encoder.TryEncode(0, new byte[1], 0, 1, wire, 0, out _));
        Assert.False(encoder.TryEncode(256, new byte[1], 0, 1, wire, 0, out _));
        Assert.False(encoder.TryEncode(1, new byte[241], 0, 241, wire, 0, out _));
        Assert.Equal(0, encoder.NextSequence);
    }

    // A property over random streams: FsCheck draws the seed of each stream of 400 random frames (random type, payload
    // and fault each), 40 streams a run.
    [FsCheck.Xunit.Property(MaxTest = 40)]
    public void A_faulty_stream_delivers_every_intact_frame_and_nothing_else(int seed)
    {
        var random = new Random(seed);
        var encoder = new LinkFrameEncoder();
        var stream = new List<byte>();
        var intact = new List<(int Sequence, byte[] Payload)>();
        var sent = new Dictionary<int, byte[]>();
        var wire = new byte[LinkFrameEncoder.MaxWireBytes];
        int faulted = 0;
        for (int k = 0; k < 400; k++)
        {
            byte[] payload = new byte[random.Next(0, LinkFrameEncoder.MaxPayloadBytes + 1)];
            random.NextBytes(payload);
            int sequence = encoder.NextSequence;
            Assert.True(encoder.TryEncode(1 + random.Next(255), payload, 0, payload.Length, wire, 0, out int written));
            sent[sequence] = payload;
            var bytes = wire.Take(written).ToList();
            int fault = random.Next(6);    // 0: none; 1 bit flip; 2 dropped byte; 3 duplicated byte; 4 truncated; 5 garbage before
            int at = random.Next(written - 1);
            switch (fault)
            {
                case 1:
                    bytes[at] ^= (byte)(1 << random.Next(8));
                    break;
                case 2:
                    bytes.RemoveAt(at);
                    break;
                case 3:
                    bytes.Insert(at, bytes[at]);
                    break;
                case 4:
                    bytes.RemoveRange(at, written - 1 - at);
                    break;
                case 5:
                    var garbage = new byte[random.Next(1, 40)];
                    random.NextBytes(garbage);
                    stream.AddRange(garbage);
                    stream.Add(0);
                    break;
            }

            if (fault == 0 || fault == 5)
            {
                intact.Add((sequence, payload));
            }
            else
            {
                faulted++;
            }

            stream.AddRange(bytes);
        }

        var decoder = new LinkFrameDecoder();
        var frame = new LinkFrame();
        var delivered = new List<(int Sequence, byte[] Payload)>();
        foreach (byte b in stream)
        {
            if (decoder.Push(b, frame))
            {
                delivered.Add((frame.Sequence, frame.Payload.Take(frame.PayloadLength).ToArray()));
            }
        }

        // Nothing delivered that was not sent as it was, and every intact frame delivered.
        foreach (var (sequence, payload) in delivered)
        {
            Assert.True(sent.TryGetValue(sequence, out byte[]? original) && original.SequenceEqual(payload), $"frame {sequence} delivered altered");
        }

        foreach (var (sequence, payload) in intact)
        {
            Assert.Contains(delivered, d => d.Sequence == sequence && d.Payload.SequenceEqual(payload));
        }

        // Each faulted frame is lost and counted (a fault can also spoil the frame after it, or split one in two), and
        // the sequence gaps count exactly the frames not delivered between the first and the last delivered.
        Assert.True(decoder.CrcErrors + decoder.Malformed >= faulted, $"{decoder.CrcErrors} CRC errors + {decoder.Malformed} malformed < {faulted} faulted frames");
        int beforeFirst = delivered.Min(d => d.Sequence);
        int afterLast = sent.Count - 1 - delivered.Max(d => d.Sequence);
        Assert.Equal(sent.Count - delivered.Count, decoder.SequenceGaps + beforeFirst + afterLast);
    }
}
