using System.Text;

namespace FreqReadout.Host.Captures;

/// <summary>
/// Constants and primitives of the binary capture format (hardware-notes/binary-capture-format.md):
/// magic, version, block tags, LEB128 unsigned varints and zigzag signed varints, length-prefixed UTF-8 strings.
/// </summary>
public static class BinaryCaptureFormat
{
    /// <summary>Format version written after the magic.</summary>
    public const byte Version = 1;

    /// <summary>Block tag of the header block (metadata and columns).</summary>
    public const byte HeaderTag = (byte)'H';

    /// <summary>Block tag of a data block (rows).</summary>
    public const byte DataTag = (byte)'D';

    /// <summary>Block tag of the end block (row total and trailer); the file ends after it.</summary>
    public const byte EndTag = (byte)'E';

    /// <summary>Most rows a writer puts in one data block.</summary>
    public const int RowsPerBlock = 4096;

    /// <summary>Largest payload a reader accepts (a larger length means a corrupt block).</summary>
    public const int MaxPayloadBytes = 64 * 1024 * 1024;

    /// <summary>Header line type: a <c>key = value</c> line.</summary>
    internal const byte KeyValueLine = 1;

    /// <summary>Header line type: a comment.</summary>
    internal const byte CommentLine = 2;

    /// <summary>Row flag: a temperature follows (8-byte IEEE 754 double, little-endian).</summary>
    internal const byte TemperatureFlag = 1;

    /// <summary>Row flag: a mark follows (string).</summary>
    internal const byte MarkFlag = 2;

    private static readonly byte[] MagicBytes = { 0x89, (byte)'F', (byte)'R', (byte)'C', (byte)'A', (byte)'P', 0x0D, 0x0A };

    /// <summary>
    /// The 8 magic bytes, 0x89 "FRCAP" CR LF: 0x89 is not valid as the first byte of UTF-8 text,
    /// so no text capture starts so; CR LF shows a line-end conversion that would corrupt the file.
    /// </summary>
    public static byte[] Magic => (byte[])MagicBytes.Clone();

    /// <summary>Appends an unsigned LEB128 varint (7 bits per byte, low group first, high bit = more follows).</summary>
    public static void WriteUVarint(Stream output, ulong value)
    {
        while (value >= 0x80)
        {
            output.WriteByte((byte)(value | 0x80));
            value >>= 7;
        }

        output.WriteByte((byte)value);
    }

    /// <summary>Writes an unsigned LEB128 varint into <paramref name="buffer"/>; returns the bytes used (at most 10).</summary>
    public static int WriteUVarint(Span<byte> buffer, ulong value)
    {
        int n = 0;
        while (value >= 0x80)
        {
            buffer[n++] = (byte)(value | 0x80);
            value >>= 7;
        }

        buffer[n++] = (byte)value;
        return n;
    }

    /// <summary>Reads an unsigned LEB128 varint at <paramref name="pos"/>; false when it runs past the end or beyond 64 bits.</summary>
    public static bool TryReadUVarint(ReadOnlySpan<byte> data, ref int pos, out ulong value)
    {
        value = 0;
        for (int shift = 0; shift < 70; shift += 7)
        {
            if (pos >= data.Length)
            {
                return false;
            }

            byte b = data[pos++];
            if (shift == 63 && b > 1)
            {
                return false;
            }

            value |= (ulong)(b & 0x7F) << shift;
            if ((b & 0x80) == 0)
            {
                return true;
            }
        }

        return false;
    }

    /// <summary>Zigzag map of a signed value onto unsigned: 0, -1, 1, -2, ... -> 0, 1, 2, 3, ...</summary>
    public static ulong ZigZag(long value) => (ulong)((value << 1) ^ (value >> 63));

    /// <summary>Inverse of <see cref="ZigZag"/>.</summary>
    public static long UnZigZag(ulong value) => (long)(value >> 1) ^ -(long)(value & 1);

    /// <summary>Appends a string: uvarint byte length, then UTF-8 bytes.</summary>
    internal static void WriteString(Stream output, string text)
    {
        byte[] bytes = Encoding.UTF8.GetBytes(text);
        WriteUVarint(output, (ulong)bytes.Length);
        output.Write(bytes, 0, bytes.Length);
    }

    /// <summary>Reads a string written by <see cref="WriteString"/>; false when it runs past the end or is not valid UTF-8.</summary>
    internal static bool TryReadString(ReadOnlySpan<byte> data, ref int pos, out string text)
    {
        text = string.Empty;
        if (!TryReadUVarint(data, ref pos, out ulong length) || length > (ulong)(data.Length - pos))
        {
            return false;
        }

        try
        {
            text = StrictUtf8.GetString(data.Slice(pos, (int)length));
        }
        catch (DecoderFallbackException)
        {
            return false;
        }

        pos += (int)length;
        return true;
    }

    private static readonly UTF8Encoding StrictUtf8 = new(false, true);
}
