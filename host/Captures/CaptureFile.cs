namespace FreqReadout.Host.Captures;

/// <summary>
/// Opens and creates capture files of either format. <see cref="Open"/> picks the format by the
/// file's first bytes (the binary magic), never by its name.
/// </summary>
public static class CaptureFile
{
    private static readonly AsyncLocal<bool> RowByRow = new();

    /// <summary>
    /// True to open captures on the path kept as the oracle of the fast one: text through a <see cref="StreamReader"/>
    /// one line at a time, and every reader row by row (no batches). Set for the current flow of execution (a test,
    /// or the CLI when the environment variable <c>FREQREADOUT_ROW_READER</c> is <c>1</c>); results are the same either way.
    /// </summary>
    internal static bool RowByRowReading
    {
        get => RowByRow.Value;
        set => RowByRow.Value = value;
    }

    /// <summary>Opens a capture for streaming, text or binary by content.</summary>
    /// <exception cref="CaptureFormatException">The header is malformed (names file, line or block, and what was expected).</exception>
    /// <exception cref="FileNotFoundException">No such file.</exception>
    public static ICaptureReader Open(string path)
    {
        var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 65536, FileOptions.SequentialScan);
        try
        {
            return Open(stream, path);
        }
        catch
        {
            stream.Dispose();
            throw;
        }
    }

    /// <summary>Opens a capture from a stream, text or binary by content. The reader owns the stream.</summary>
    /// <param name="stream">Capture bytes; need not be seekable.</param>
    /// <param name="sourceName">Name used in messages.</param>
    public static ICaptureReader Open(Stream stream, string sourceName)
    {
        var buffered = stream.CanSeek ? stream : new BufferedStream(stream, 65536);
        var format = DetectFormat(buffered, out Stream rest, out int headBytes, out bool magicPrefix);
        if (format == CaptureFileFormat.Text && magicPrefix)
        {
            // A binary capture cut inside its magic (e.g. by `head -c`) would otherwise read as text with a bad byte.
            throw new CaptureFormatException(sourceName, 0, $"the file ends after {headBytes} of the {BinaryCaptureFormat.Magic.Length} bytes of the binary capture magic: a truncated binary capture, no rows are readable");
        }

        if (RowByRowReading)
        {
            return new RowByRowCaptureReader(format == CaptureFileFormat.Binary
                ? new BinaryCaptureReader(rest, sourceName)
                : TextCaptureReader.OpenLineBased(rest, sourceName));
        }

        return format == CaptureFileFormat.Binary
            ? new BinaryCaptureReader(rest, sourceName)
            : new TextCaptureReader(rest, sourceName);
    }

    /// <summary>Tells the format of a file by its first bytes.</summary>
    public static CaptureFileFormat DetectFormat(string path)
    {
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read);
        return DetectFormat(stream, out _, out _, out _);
    }

    /// <summary>Creates (overwrites) a capture file in the given format; the header is written at once.</summary>
    /// <exception cref="ArgumentException">The metadata is not writable (names the property and its allowed range).</exception>
    public static ICaptureWriter Create(string path, CaptureMetadata metadata, CaptureFileFormat format)
    {
        var stream = new FileStream(path, FileMode.Create, FileAccess.Write, FileShare.None, 65536);
        try
        {
            return Create(stream, metadata, format);
        }
        catch
        {
            stream.Dispose();
            throw;
        }
    }

    /// <summary>Writes a capture to a stream in the given format; the writer owns the stream.</summary>
    public static ICaptureWriter Create(Stream stream, CaptureMetadata metadata, CaptureFileFormat format)
    {
        return format == CaptureFileFormat.Binary
            ? new BinaryCaptureWriter(stream, metadata)
            : new TextCaptureWriter(stream, metadata);
    }

    /// <summary>
    /// Peeks at the first bytes: the binary magic means binary, anything else is handed to the text
    /// reader (which reports "not a capture" when the magic line is missing too).
    /// </summary>
    /// <param name="magicPrefix">True when the file is shorter than the magic but every byte it has matches it.</param>
    private static CaptureFileFormat DetectFormat(Stream stream, out Stream rest, out int headBytes, out bool magicPrefix)
    {
        byte[] magic = BinaryCaptureFormat.Magic;
        byte[] head = new byte[magic.Length];
        int n = 0;
        while (n < head.Length)
        {
            int got = stream.Read(head, n, head.Length - n);
            if (got == 0)
            {
                break;
            }

            n += got;
        }

        bool binary = n == magic.Length && head.AsSpan().SequenceEqual(magic);
        headBytes = n;
        magicPrefix = n > 0 && n < magic.Length && head.AsSpan(0, n).SequenceEqual(magic.AsSpan(0, n));
        rest = new PrefixedStream(head, n, stream);
        return binary ? CaptureFileFormat.Binary : CaptureFileFormat.Text;
    }
}
