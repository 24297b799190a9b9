using System.Buffers.Binary;

namespace FreqReadout.Tests.Import;

/// <summary>Test helper: writes RIFF WAVE files of invented tones in every sample format the importer reads, with extra chunks around the data.</summary>
internal static class WavBuilder
{
    public static byte[] Build(double[][] channels, int rate, int bits, bool isFloat, bool extensible, bool extraChunks)
    {
        int count = channels.Length;
        int width = bits / 8;
        int frames = channels[0].Length;
        var data = new byte[frames * count * width];
        for (int i = 0; i < frames; i++)
        {
            for (int c = 0; c < count; c++)
            {
                double v = Math.Clamp(channels[c][i], -1, 1);
                Span<byte> at = data.AsSpan(((i * count) + c) * width, width);
                switch (isFloat, bits)
                {
                    case (true, 32): BinaryPrimitives.WriteSingleLittleEndian(at, (float)v); break;
                    case (true, 64): BinaryPrimitives.WriteDoubleLittleEndian(at, v); break;
                    case (false, 8): at[0] = (byte)Math.Clamp(Math.Round((v * 128) + 128), 0, 255); break;
                    case (false, 16): BinaryPrimitives.WriteInt16LittleEndian(at, (short)Math.Clamp(Math.Round(v * 32768), -32768, 32767)); break;
                    case (false, 24):
                        int s24 = (int)Math.Clamp(Math.Round(v * 8388608), -8388608, 8388607);
                        at[0] = (byte)s24;
                        at[1] = (byte)(s24 >> 8);
                        at[2] = (byte)(s24 >> 16);
                        break;
                    default: BinaryPrimitives.WriteInt32LittleEndian(at, (int)Math.Clamp(Math.Round(v * 2147483648.0), int.MinValue, int.MaxValue)); break;
                }
            }
        }

        var chunks = new List<byte[]>();
        var fmt = new byte[extensible ? 40 : 16];
        BinaryPrimitives.WriteUInt16LittleEndian(fmt, (ushort)(extensible ? 0xFFFE : isFloat ? 3 : 1));
        BinaryPrimitives.WriteUInt16LittleEndian(fmt.AsSpan(2), (ushort)count);
        BinaryPrimitives.WriteUInt32LittleEndian(fmt.AsSpan(4), (uint)rate);
        BinaryPrimitives.WriteUInt32LittleEndian(fmt.AsSpan(8), (uint)(rate * count * width));
        BinaryPrimitives.WriteUInt16LittleEndian(fmt.AsSpan(12), (ushort)(count * width));
        BinaryPrimitives.WriteUInt16LittleEndian(fmt.AsSpan(14), (ushort)bits);
        if (extensible)
        {
            BinaryPrimitives.WriteUInt16LittleEndian(fmt.AsSpan(16), 22);
            BinaryPrimitives.WriteUInt16LittleEndian(fmt.AsSpan(18), (ushort)bits);
            BinaryPrimitives.WriteUInt16LittleEndian(fmt.AsSpan(24), (ushort)(isFloat ? 3 : 1));
        }

        chunks.Add(Chunk("fmt ", fmt));
        if (extraChunks)
        {
            chunks.Add(Chunk("LIST", new byte[] { 1, 2, 3 }));    // odd length: padded
        }

        chunks.Add(Chunk("data", data));
        if (extraChunks)
        {
            chunks.Add(Chunk("note", new byte[] { 9 }));
        }

        byte[] body = chunks.SelectMany(c => c).ToArray();
        var file = new byte[12 + body.Length];
        "RIFF"u8.CopyTo(file);
        BinaryPrimitives.WriteUInt32LittleEndian(file.AsSpan(4), (uint)(4 + body.Length));
        "WAVE"u8.CopyTo(file.AsSpan(8));
        body.CopyTo(file, 12);
        return file;
    }

    private static byte[] Chunk(string id, byte[] content)
    {
        var chunk = new byte[8 + content.Length + (content.Length & 1)];
        System.Text.Encoding.ASCII.GetBytes(id).CopyTo(chunk, 0);
        BinaryPrimitives.WriteUInt32LittleEndian(chunk.AsSpan(4), (uint)content.Length);
        content.CopyTo(chunk, 8);
        return chunk;
    }

    /// <summary>A tone of <paramref name="hz"/> with white noise and a slow amplitude wobble (invented), <paramref name="seconds"/> long.</summary>
    public static double[] Tone(double hz, double seconds, int rate, double noise, int seed, Func<double, double>? amplitudeAt = null)
    {
        var rng = new Random(seed);
        int n = (int)(seconds * rate);
        var x = new double[n];
        for (int i = 0; i < n; i++)
        {
            double t = (double)i / rate;
            double amplitude = amplitudeAt?.Invoke(t) ?? 0.5 * (1 + (0.3 * Math.Sin(2 * Math.PI * 0.7 * t)));
            x[i] = (amplitude * Math.Sin(2 * Math.PI * hz * t)) + (noise * (rng.NextDouble() - 0.5));
        }

        return x;
    }
}
