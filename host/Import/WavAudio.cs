using System.Buffers.Binary;

namespace FreqReadout.Host.Import;

/// <summary>
/// The samples of one channel of a RIFF WAVE file (Microsoft/IBM, "Multimedia Programming Interface and Data
/// Specifications 1.0", 1991, and Microsoft's WAVE_FORMAT_EXTENSIBLE note; from memory): chunks in any order with
/// odd-length padding, a "fmt " chunk of PCM (8-bit unsigned, 16/24/32-bit signed) or IEEE float (32 and 64 bits), also
/// as WAVE_FORMAT_EXTENSIBLE (its sub-format's first two bytes say which), and a "data" chunk. Samples are scaled to
/// [-1, 1). The whole channel is read into memory (a phone recording of an hour at 48 kHz is 170 M samples: about
/// 1.4 GB; longer files are refused with the figure).
/// </summary>
public sealed class WavAudio
{
    /// <summary>Most samples a channel may have.</summary>
    public const long MaxSamples = 200_000_000;

    private WavAudio(double sampleRateHz, int channels, int bitsPerSample, bool isFloat, double[] samples)
    {
        SampleRateHz = sampleRateHz;
        Channels = channels;
        BitsPerSample = bitsPerSample;
        IsFloat = isFloat;
        Samples = samples;
    }

    /// <summary>Samples a second.</summary>
    public double SampleRateHz { get; }

    /// <summary>Channels in the file.</summary>
    public int Channels { get; }

    /// <summary>Bits per sample.</summary>
    public int BitsPerSample { get; }

    /// <summary>True for IEEE float samples.</summary>
    public bool IsFloat { get; }

    /// <summary>The chosen channel's samples, in [-1, 1).</summary>
    public double[] Samples { get; }

    /// <summary>Reads channel <paramref name="channel"/> (0-based) of a WAVE file.</summary>
    /// <exception cref="WavFormatException">Not a WAVE file this reader reads (names the offset and what was expected).</exception>
    public static WavAudio Read(string path, int channel)
    {
        byte[] bytes = File.ReadAllBytes(path);
        if (bytes.Length < 12 || !Tag(bytes, 0, "RIFF") || !Tag(bytes, 8, "WAVE"))
        {
            throw new WavFormatException($"{path}: not a WAVE file: expected 'RIFF' at byte 0 and 'WAVE' at byte 8");
        }

        int format = -1;
        int channels = 0;
        int rate = 0;
        int blockAlign = 0;
        int bits = 0;
        int dataOffset = -1;
        int dataLength = 0;
        int at = 12;
        while (at + 8 <= bytes.Length)
        {
            string id = System.Text.Encoding.ASCII.GetString(bytes, at, 4);
            long size = BinaryPrimitives.ReadUInt32LittleEndian(bytes.AsSpan(at + 4));
            int body = at + 8;
            if (body + size > bytes.Length)
            {
                if (id == "data")
                {
                    size = bytes.Length - body;    // a recording cut short: keep what is there
                }
                else
                {
                    throw new WavFormatException($"{path}: chunk '{id}' at byte {at} says {size} bytes, but the file ends {bytes.Length - body} bytes after its header");
                }
            }

            if (id == "fmt ")
            {
                if (size < 16)
                {
                    throw new WavFormatException($"{path}: the 'fmt ' chunk at byte {at} is {size} bytes; at least 16 expected");
                }

                format = BinaryPrimitives.ReadUInt16LittleEndian(bytes.AsSpan(body));
                channels = BinaryPrimitives.ReadUInt16LittleEndian(bytes.AsSpan(body + 2));
                rate = (int)BinaryPrimitives.ReadUInt32LittleEndian(bytes.AsSpan(body + 4));
                blockAlign = BinaryPrimitives.ReadUInt16LittleEndian(bytes.AsSpan(body + 12));
                bits = BinaryPrimitives.ReadUInt16LittleEndian(bytes.AsSpan(body + 14));
                if (format == 0xFFFE)
                {
                    if (size < 40)
                    {
                        throw new WavFormatException($"{path}: WAVE_FORMAT_EXTENSIBLE 'fmt ' chunk at byte {at} is {size} bytes; 40 expected");
                    }

                    format = BinaryPrimitives.ReadUInt16LittleEndian(bytes.AsSpan(body + 24));    // the sub-format GUID's first two bytes
                }
            }
            else if (id == "data")
            {
                dataOffset = body;
                dataLength = (int)size;
            }

            at = body + (int)size + (int)(size & 1);    // chunks are padded to an even length
        }

        if (format < 0)
        {
            throw new WavFormatException($"{path}: no 'fmt ' chunk");
        }

        if (dataOffset < 0)
        {
            throw new WavFormatException($"{path}: no 'data' chunk");
        }

        bool isFloat = format == 3;
        bool supported = (format == 1 && bits is 8 or 16 or 24 or 32) || (isFloat && bits is 32 or 64);
        if (!supported || channels < 1 || rate < 1 || blockAlign != channels * (bits / 8))
        {
            throw new WavFormatException($"{path}: format {format}, {bits} bits, {channels} channel(s), {rate} Hz, block {blockAlign} bytes: expected PCM of 8, 16, 24 or 32 bits or IEEE float of 32 or 64 bits (format 1 or 3, or WAVE_FORMAT_EXTENSIBLE of them)");
        }

        if (channel < 0 || channel >= channels)
        {
            throw new WavFormatException($"{path}: has {channels} channel(s); --channel must be 0 to {channels - 1}", optionOutOfRange: true);
        }

        long frames = dataLength / blockAlign;
        if (frames > MaxSamples)
        {
            throw new WavFormatException($"{path}: {frames} samples a channel; at most {MaxSamples} (cut the recording into parts)");
        }

        int width = bits / 8;
        var samples = new double[frames];
        for (long i = 0; i < frames; i++)
        {
            int p = dataOffset + (int)(i * blockAlign) + (channel * width);
            samples[i] = (format, bits) switch
            {
                (1, 8) => (bytes[p] - 128) / 128.0,
                (1, 16) => BinaryPrimitives.ReadInt16LittleEndian(bytes.AsSpan(p)) / 32768.0,
                (1, 24) => (((bytes[p + 2] << 24) | (bytes[p + 1] << 16) | (bytes[p] << 8)) >> 8) / 8388608.0,
                (1, 32) => BinaryPrimitives.ReadInt32LittleEndian(bytes.AsSpan(p)) / 2147483648.0,
                (3, 32) => BinaryPrimitives.ReadSingleLittleEndian(bytes.AsSpan(p)),
                _ => BinaryPrimitives.ReadDoubleLittleEndian(bytes.AsSpan(p)),
            };
        }

        return new WavAudio(rate, channels, bits, isFloat, samples);
    }

    private static bool Tag(byte[] bytes, int at, string tag) => System.Text.Encoding.ASCII.GetString(bytes, at, 4) == tag;
}
