using System.Globalization;
using System.Text;

namespace FreqReadout.Host.Captures;

/// <summary>
/// Streaming reader of the capture text format (docs/capture-text-format.md). The header
/// (magic line, metadata, column header) is read and checked when the reader is built; data rows
/// are parsed one line at a time as <see cref="ReadRows"/> is enumerated, so a capture larger than
/// memory replays. Trailer lines are collected as they are met.
/// </summary>
/// <remarks>
/// Decisions beyond the contract's words: the first non-blank line must be the magic line; a
/// <c>#</c> line after the column header starts the trailer, and every line after it must be a
/// <c># key = value</c> line (no comments, no data); trailer keys are unique; every data row has
/// exactly one field per column; with <c>timer_bits = 64</c> the reader rejects a tick that does not
/// strictly increase (for narrower timers whether a step is plausible is the unwrapper's concern,
/// see <c>CaptureGateSource</c>); with <c>count_bits = 64</c> it rejects a count that decreases.
/// Every error is a <see cref="CaptureFormatException"/> naming the line and what was expected.
/// </remarks>
public sealed class TextCaptureReader : ICaptureBatchReader
{
    /// <summary>The first line of every text capture.</summary>
    public const string MagicLine = "# freqreadout capture 1";

    private const string MagicPrefix = "# freqreadout capture";

    private readonly TextReader _reader;
    private readonly bool _leaveOpen;
    private readonly List<string> _warnings = new();
    private readonly List<KeyValuePair<string, string>> _trailer = new();
    private readonly ColumnKind[] _columns;
    private readonly string _headerText;
    private readonly Dictionary<string, long> _trailerKeys = new(StringComparer.Ordinal);
    private readonly Utf8LineReader? _lines;
    private long _lineNumber;
    private bool _started;
    private bool _rowsEnded;
    private bool _inTrailer;
    private long _firstTrailerLine;
    private ulong _tickLimit;
    private ulong _countLimit;
    private CaptureRowOrder? _order;
    private readonly BatchErrorHold _errors = new();
    private Action<CaptureRowBatch>? _fillBatch;

    /// <summary>
    /// Reads a text capture from a stream (UTF-8, an optional BOM is skipped), in 1 MiB blocks, with the fast path for
    /// digits-only rows in <see cref="ReadBatch"/>.
    /// </summary>
    /// <param name="stream">The capture bytes.</param>
    /// <param name="sourceName">Name used in messages (usually the file path).</param>
    /// <param name="leaveOpen">True to leave <paramref name="stream"/> open on dispose.</param>
    public TextCaptureReader(Stream stream, string sourceName, bool leaveOpen = false)
        : this(new Utf8LineReader(stream, leaveOpen), sourceName, leaveOpen: false)
    {
    }

    /// <summary>The fast reader with a byte buffer of <paramref name="bufferBytes"/> (tests cross buffer boundaries with small ones).</summary>
    internal TextCaptureReader(Stream stream, string sourceName, int bufferBytes)
        : this(new Utf8LineReader(stream, leaveOpen: false, bufferBytes), sourceName, leaveOpen: false)
    {
    }

    /// <summary>
    /// The line-based reader kept as the fast path's oracle: a <see cref="StreamReader"/>, one string per line, every
    /// row through the per-line parser (tests compare the two; <c>FREQREADOUT_ROW_READER=1</c> selects it in the CLI).
    /// </summary>
    /// <param name="stream">The capture bytes.</param>
    /// <param name="sourceName">Name used in messages (usually the file path).</param>
    /// <param name="leaveOpen">True to leave <paramref name="stream"/> open on dispose.</param>
    public static TextCaptureReader OpenLineBased(Stream stream, string sourceName, bool leaveOpen = false) =>
        new(new StreamReader(stream, new UTF8Encoding(false, false), detectEncodingFromByteOrderMarks: false, bufferSize: 65536, leaveOpen: leaveOpen), sourceName, leaveOpen: false);

    /// <summary>Reads a text capture from a text reader (a leading U+FEFF is skipped).</summary>
    /// <param name="reader">The capture text.</param>
    /// <param name="sourceName">Name used in messages (usually the file path).</param>
    /// <param name="leaveOpen">True to leave <paramref name="reader"/> open on dispose.</param>
    public TextCaptureReader(TextReader reader, string sourceName, bool leaveOpen = false)
    {
        _reader = reader;
        _lines = reader as Utf8LineReader;
        _leaveOpen = leaveOpen;
        SourceName = sourceName;
        try
        {
            (Metadata, _columns, _headerText) = ReadHeader();
        }
        catch
        {
            if (!leaveOpen)
            {
                reader.Dispose();
            }

            throw;
        }
    }

    /// <summary>Opens a text capture file.</summary>
    public static TextCaptureReader Open(string path)
    {
        var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.Read, 65536, FileOptions.SequentialScan);
        return new TextCaptureReader(stream, path);
    }

    private enum ColumnKind
    {
        Tick,
        Count,
        TemperatureC,
        Mark,
    }

    /// <inheritdoc/>
    public string SourceName { get; }

    /// <inheritdoc/>
    public CaptureMetadata Metadata { get; }

    /// <inheritdoc/>
    public IReadOnlyList<string> Warnings => _warnings;

    /// <inheritdoc/>
    public IReadOnlyList<KeyValuePair<string, string>> Trailer => _trailer;

    /// <summary>Rows <see cref="ReadBatch"/> read on the fast path (digits-only rows straight from the bytes), for tests.</summary>
    internal long FastRows { get; private set; }

    /// <summary>The column header row as read (for messages).</summary>
    public string ColumnHeader => _headerText;

    /// <inheritdoc/>
    public IEnumerable<CaptureRow> ReadRows()
    {
        if (_started)
        {
            throw new InvalidOperationException("ReadRows streams the capture once; open the file again to read it again");
        }

        _started = true;
        return Rows();
    }

    /// <inheritdoc/>
    public void Dispose()
    {
        if (!_leaveOpen)
        {
            _reader.Dispose();
        }
    }

    private IEnumerable<CaptureRow> Rows()
    {
        StartRows();
        string? line;
        while ((line = NextLine()) != null)
        {
            if (TryParseLine(line, out CaptureRow row))
            {
                yield return row;
            }
        }
    }

    /// <inheritdoc/>
    public bool ReadBatch(CaptureRowBatch batch)
    {
        batch.Clear();
        if (!_started)
        {
            _started = true;
            StartRows();
        }

        _errors.ThrowIfHeld();
        if (_rowsEnded)
        {
            return false;
        }

        return _errors.Fill(batch, _fillBatch ??= FillBatch);
    }

    /// <summary>
    /// Fills the batch: digits-only rows of a one-column capture straight from the bytes, every other line (blank,
    /// comment, trailer, CRLF, extra columns, a bad value, more than 19 digits) through <see cref="TryParseLine"/>, the
    /// line-based parser, so every row, message and line number is that parser's.
    /// </summary>
    private void FillBatch(CaptureRowBatch batch)
    {
        Utf8LineReader? bytes = _lines;
        bool fast = bytes != null && _columns.Length == 1;
        bool checkOrder = _order!.ChecksOrder;
        while (!batch.IsFull)
        {
            if (fast && !_inTrailer && bytes!.AtLineStart && _lineNumber > 0)
            {
                if (bytes.End - bytes.Start < FastRowMaxBytes)
                {
                    bytes.Fill(FastRowMaxBytes);
                }

                byte[] b = bytes.Bytes;
                int p = bytes.Start;
                int end = bytes.End;
                long line = _lineNumber;
                ulong limit = _tickLimit;
                int before = batch.Count;
                int rowsBeforeRun = 0;
                while (!batch.IsFull && end - p >= FastRowMaxBytes)
                {
                    if (!checkOrder && rowsBeforeRun-- <= 0)
                    {
                        // Runs of LF rows of up to 15 digits, 64 bytes at a time; after a window with none (CRLF
                        // rows, longer ones), a few rows one at a time before the next try.
                        if (DigitRows.ReadRun(b, ref p, end, limit, batch, ref line) > 0)
                        {
                            continue;
                        }

                        rowsBeforeRun = 32;
                    }

                    // A row is 1-19 digits then "\n" or "\r\n": no overflow, no other character, no blank line.
                    int taken = DigitRows.TryRead(b, p, out ulong value);
                    if (taken == 0 || value > limit)
                    {
                        break;
                    }

                    int next = p + taken;
                    line++;
                    if (checkOrder)
                    {
                        string? orderProblem = _order.Check(new CaptureRow(line, value, 0, null, null), "line");
                        if (orderProblem != null)
                        {
                            _lineNumber = line;
                            bytes.Advance(next - bytes.Start);
                            throw Error(line, orderProblem);
                        }
                    }

                    batch.AddTick(value, 0, line);
                    p = next;
                }

                bytes.Advance(p - bytes.Start);
                bool progressed = line != _lineNumber;
                FastRows += batch.Count - before;
                _lineNumber = line;
                if (progressed || batch.IsFull)
                {
                    continue;
                }
            }

            string? text = NextLine();
            if (text == null)
            {
                _rowsEnded = true;
                return;
            }

            if (TryParseLine(text, out CaptureRow row))
            {
                batch.Add(row);
            }
        }
    }

    /// <summary>Bytes the fast path wants buffered before it reads a row (the longest fast row, 19 digits and CRLF, plus one).</summary>
    private const int FastRowMaxBytes = DigitRows.ReadableBytes;

    private void StartRows()
    {
        var md = Metadata;
        _tickLimit = MaxValue(md.TimerBits);
        _countLimit = MaxValue(md.CountBits);
        _order = new CaptureRowOrder(md);
    }

    /// <summary>
    /// Parses one line after the column header: a data row (true, with <paramref name="row"/>), or a blank or trailer
    /// line (false). Throws <see cref="CaptureFormatException"/> naming the line for anything else.
    /// </summary>
    private bool TryParseLine(string line, out CaptureRow row)
    {
        row = default;
        var md = Metadata;
        if (string.IsNullOrWhiteSpace(line))
        {
            return false;
        }

        ReadOnlySpan<char> span = line.AsSpan().Trim();
        if (span[0] == '#')
        {
            if (!_inTrailer)
            {
                _inTrailer = true;
                _firstTrailerLine = _lineNumber;
            }

            ReadTrailerLine(line.TrimStart().Substring(1), _trailerKeys);
            return false;
        }

        if (_inTrailer)
        {
            throw Error(_lineNumber, $"expected only trailer lines '# key = value' after the first trailer line (line {_firstTrailerLine}), found a data row; nothing else may follow the trailer");
        }

        int fields = CountFields(span);
        if (fields != _columns.Length)
        {
            throw Error(_lineNumber, $"expected {_columns.Length} comma-separated field{(_columns.Length == 1 ? "" : "s")} ({_headerText}), found {fields}");
        }

        ulong tick = 0;
        ulong count = 0;
        double? temperature = null;
        string? mark = null;
        int field = 0;
        int start = 0;
        while (true)
        {
            int comma = span.Slice(start).IndexOf(',');
            ReadOnlySpan<char> text = (comma < 0 ? span.Slice(start) : span.Slice(start, comma)).Trim();
            switch (_columns[field])
            {
                case ColumnKind.Tick:
                    tick = ParseUnsigned(text, "tick", md.TimerBits, _tickLimit, "timer_bits");
                    break;
                case ColumnKind.Count:
                    count = ParseUnsigned(text, "count", md.CountBits, _countLimit, "count_bits");
                    break;
                case ColumnKind.TemperatureC:
                    if (!text.IsEmpty)
                    {
                        if (!CaptureMetadataParser.TryParseDouble(text, out double t))
                        {
                            throw Error(_lineNumber, $"expected temp_c as a number of deg C in [-273.15, 1000] with '.' as decimal separator (or blank for no new sample), found {TextExcerpt.Quote(text)}");
                        }

                        if (CaptureColumns.TemperatureProblem(t) is string range)
                        {
                            throw Error(_lineNumber, range);
                        }

                        temperature = t;
                    }

                    break;
                case ColumnKind.Mark:
                    if (!text.IsEmpty)
                    {
                        mark = text.ToString();
                    }

                    break;
            }

            field++;
            if (comma < 0)
            {
                break;
            }

            start += comma + 1;
        }

        row = new CaptureRow(_lineNumber, tick, count, temperature, mark);
        string? orderProblem = _order!.Check(row, "line");
        if (orderProblem != null)
        {
            throw Error(_lineNumber, orderProblem);
        }

        return true;
    }

    private static int CountFields(ReadOnlySpan<char> span)
    {
        int n = 1;
        foreach (char c in span)
        {
            if (c == ',')
            {
                n++;
            }
        }

        return n;
    }

    private void ReadTrailerLine(string afterHash, Dictionary<string, long> keys)
    {
        if (!CaptureMetadataParser.TrySplitKeyValue(afterHash, out string key, out string value))
        {
            throw Error(_lineNumber, $"expected a trailer line '# key = value' (only trailer metadata may follow the data rows), found {TextExcerpt.Quote("#" + afterHash)}");
        }

        string? syntax = CaptureMetadataParser.CheckKeySyntax(key);
        if (syntax != null)
        {
            throw Error(_lineNumber, syntax);
        }

        if (keys.TryGetValue(key, out long first))
        {
            throw Error(_lineNumber, $"duplicate trailer key {TextExcerpt.Quote(key)} (first given at line {first}); each key may appear once");
        }

        keys[key] = _lineNumber;
        _trailer.Add(new KeyValuePair<string, string>(key, value));
    }

    private ulong ParseUnsigned(ReadOnlySpan<char> text, string column, int bits, ulong max, string widthKey)
    {
        if (text.IsEmpty)
        {
            throw Error(_lineNumber, $"expected the {column} as an unsigned integer, found an empty field");
        }

        foreach (char c in text)
        {
            if (c < '0' || c > '9')
            {
                throw Error(_lineNumber, $"expected the {column} as an unsigned integer (digits only), found {TextExcerpt.Quote(text)}");
            }
        }

        if (!ulong.TryParse(text, NumberStyles.None, CultureInfo.InvariantCulture, out ulong value) || value > max)
        {
            throw Error(_lineNumber, $"{column} {TextExcerpt.Plain(text)} exceeds the {(column == "tick" ? "timer" : "counter")} width: {widthKey} = {bits} allows 0 to {max}");
        }

        return value;
    }

    private static ulong MaxValue(int bits) => bits >= 64 ? ulong.MaxValue : (1UL << bits) - 1;

    private (CaptureMetadata, ColumnKind[], string) ReadHeader()
    {
        string? line;
        do
        {
            line = NextMagicCandidate();
            if (line == null)
            {
                throw Error(Math.Max(1, _lineNumber), $"not a capture: expected the first line '{MagicLine}', found an empty file");
            }
        }
        while (string.IsNullOrWhiteSpace(line));

        string magic = line.Trim();
        if (magic != MagicLine)
        {
            if (magic.StartsWith(MagicPrefix, StringComparison.Ordinal))
            {
                throw Error(_lineNumber, $"unsupported capture version: expected '{MagicLine}', found {TextExcerpt.Quote(magic)}");
            }

            throw Error(_lineNumber, $"not a capture: expected the first line '{MagicLine}', found {TextExcerpt.Quote(magic)}");
        }

        var parser = new CaptureMetadataParser(SourceName, _warnings);
        while (true)
        {
            line = NextLine();
            if (line == null)
            {
                throw Error(_lineNumber + 1, "expected the column header row ('tick', or 'tick,count' for kind = snapshots), found the end of the file");
            }

            if (string.IsNullOrWhiteSpace(line))
            {
                continue;
            }

            string trimmed = line.Trim();
            if (trimmed[0] == '#')
            {
                string afterHash = line.TrimStart().Substring(1);
                if (CaptureMetadataParser.TrySplitKeyValue(afterHash, out string key, out string value))
                {
                    parser.Add(key, value, _lineNumber);
                }
                else
                {
                    parser.AddComment(afterHash);
                }

                continue;
            }

            var md = parser.Metadata;
            string expected = md.Kind == CaptureKind.Snapshots ? "'tick,count' (kind = snapshots)" : "'tick' (kind = edges)";
            string[] names = trimmed.Split(',');
            for (int i = 0; i < names.Length; i++)
            {
                names[i] = names[i].Trim();
            }

            if (names[0] != CaptureColumns.Tick)
            {
                throw Error(_lineNumber, $"expected the column header row starting with {expected} before the data rows, found {TextExcerpt.Quote(trimmed)}");
            }

            parser.Finish(_lineNumber);
            var columns = new List<ColumnKind> { ColumnKind.Tick };
            int first = 1;
            if (md.Kind == CaptureKind.Snapshots)
            {
                if (names.Length < 2 || names[1] != CaptureColumns.Count)
                {
                    throw Error(_lineNumber, $"expected the column header row starting with {expected}, found {TextExcerpt.Quote(trimmed)}");
                }

                columns.Add(ColumnKind.Count);
                first = 2;
            }

            for (int i = first; i < names.Length; i++)
            {
                string name = names[i];
                ColumnKind kind;
                if (name == CaptureColumns.TemperatureC)
                {
                    kind = ColumnKind.TemperatureC;
                }
                else if (name == CaptureColumns.Mark)
                {
                    kind = ColumnKind.Mark;
                }
                else if (name == CaptureColumns.Count)
                {
                    throw Error(_lineNumber, "unexpected column 'count': it belongs to kind = snapshots (give '# kind = snapshots' before the column header); expected only temp_c and mark after 'tick'");
                }
                else if (name.Length == 0)
                {
                    throw Error(_lineNumber, $"empty column name in the column header (column {i + 1}); expected temp_c or mark");
                }
                else
                {
                    throw Error(_lineNumber, $"unknown column {TextExcerpt.Quote(name)}; expected only temp_c and mark after {expected}");
                }

                if (columns.Contains(kind))
                {
                    throw Error(_lineNumber, $"column {TextExcerpt.Quote(name)} appears twice in the column header; each column may appear once");
                }

                columns.Add(kind);
                md.ExtraColumns.Add(name);
            }

            return (md, columns.ToArray(), string.Join(",", names));
        }
    }

    /// <summary>Longest first line read while looking for the magic line (an image or binary file need not hold a line break at all).</summary>
    private const int MaxMagicLineChars = 4096;

    /// <summary>
    /// The next line before the magic line is found, read at most <see cref="MaxMagicLineChars"/> characters far: a
    /// file that is not text (an image, an archive, a binary of another program) is "not a capture", not a UTF-8 fault.
    /// </summary>
    private string? NextMagicCandidate()
    {
        var text = new System.Text.StringBuilder();
        int c;
        while ((c = _reader.Read()) >= 0 && c != '\n' && text.Length < MaxMagicLineChars)
        {
            text.Append((char)c);
        }

        if (c < 0 && text.Length == 0)
        {
            return null;
        }

        _lineNumber++;
        string line = text.ToString().TrimEnd('\r');
        if (_lineNumber == 1 && line.Length > 0 && line[0] == '\uFEFF')
        {
            line = line.Substring(1);
        }

        if (LooksBinary(line))
        {
            throw Error(_lineNumber, $"not a capture (no '{MagicLine}' line): the file starts with binary data, not text");
        }

        if (text.Length >= MaxMagicLineChars)
        {
            throw Error(_lineNumber, $"not a capture: expected the first line '{MagicLine}', found {TextExcerpt.Quote(line)}");
        }

        return line;
    }

    /// <summary>True for text that cannot be the start of a text capture: bytes that are not UTF-8, or control characters other than tab.</summary>
    private static bool LooksBinary(string line)
    {
        foreach (char ch in line)
        {
            if (ch == '\uFFFD' || (char.IsControl(ch) && ch != '\t' && ch != '\r'))
            {
                return true;
            }
        }

        return false;
    }

    private string? NextLine()
    {
        string? line = _reader.ReadLine();
        if (line == null)
        {
            return null;
        }

        _lineNumber++;
        if (_lineNumber == 1 && line.Length > 0 && line[0] == '\uFEFF')
        {
            line = line.Substring(1);
        }

        if (line.Contains('\uFFFD'))
        {
            throw Error(_lineNumber, "expected UTF-8 text: the line holds a byte sequence that is not valid UTF-8");
        }

        return line;
    }

    private CaptureFormatException Error(long line, string problem) => new(SourceName, line, problem);
}
