using System.Text;

namespace FreqReadout.Host.Captures;

/// <summary>
/// A <see cref="TextReader"/> over UTF-8 bytes that reads the stream in 1 MiB blocks and lets the text capture
/// reader look at the raw bytes at the start of a line (its fast path for digits-only rows). Characters and lines
/// are exactly those of a <see cref="StreamReader"/> with <c>new UTF8Encoding(false, false)</c> and no byte-order-mark
/// detection: the same stateful decoder (invalid bytes become U+FFFD), and <see cref="ReadLine"/> ends a line at
/// "\n", "\r" or "\r\n". Bytes are decoded at most up to the next '\n' byte, so whenever every decoded character has
/// been read and the last one was a '\n', the byte position is the start of the next line (<see cref="AtLineStart"/>).
/// </summary>
internal sealed class Utf8LineReader : TextReader
{
    /// <summary>Bytes read from the stream at a time (the buffer never grows).</summary>
    public const int BufferBytes = 1 << 20;

    /// <summary>Most bytes decoded to characters at a time.</summary>
    private const int MaxDecodeBytes = 65536;

    private static readonly UTF8Encoding Encoding = new(false, false);

    private readonly Stream _stream;
    private readonly bool _leaveOpen;
    private readonly byte[] _bytes;
    private readonly Decoder _decoder = Encoding.GetDecoder();
    private readonly char[] _chars = new char[Encoding.GetMaxCharCount(MaxDecodeBytes)];
    private int _start;
    private int _end;
    private bool _streamEnded;
    private bool _flushed;
    private int _charPos;
    private int _charLen;
    private bool _midLine;

    /// <summary>Reads from <paramref name="stream"/>.</summary>
    /// <param name="stream">UTF-8 bytes.</param>
    /// <param name="leaveOpen">True to leave the stream open on dispose.</param>
    /// <param name="bufferBytes">Buffer size, at least 64 (tests use small buffers to cross block boundaries often).</param>
    public Utf8LineReader(Stream stream, bool leaveOpen, int bufferBytes = BufferBytes)
    {
        ArgumentOutOfRangeException.ThrowIfLessThan(bufferBytes, 64);
        _bytes = new byte[bufferBytes];
        _stream = stream;
        _leaveOpen = leaveOpen;
    }

    /// <summary>The byte buffer (valid bytes are <see cref="Start"/> to <see cref="End"/>).</summary>
    public byte[] Bytes => _bytes;

    /// <summary>First unread byte in <see cref="Bytes"/>.</summary>
    public int Start => _start;

    /// <summary>One past the last buffered byte in <see cref="Bytes"/>.</summary>
    public int End => _end;

    /// <summary>True when the stream has no more bytes beyond <see cref="End"/>.</summary>
    public bool StreamEnded => _streamEnded;

    /// <summary>True when every decoded character has been read and the next byte starts a line.</summary>
    public bool AtLineStart => _charPos == _charLen && !_midLine;

    /// <summary>
    /// Buffers at least <paramref name="bytes"/> bytes from <see cref="Start"/> when the stream has them (fewer at its
    /// end), moving the unread bytes to the front of the buffer first when needed. Reads the stream in large blocks.
    /// </summary>
    /// <param name="bytes">Bytes wanted, at most the buffer's size.</param>
    public void Fill(int bytes)
    {
        if (_end - _start >= bytes || _streamEnded)
        {
            return;
        }

        if (_start > 0)
        {
            int unread = _end - _start;
            Buffer.BlockCopy(_bytes, _start, _bytes, 0, unread);
            _start = 0;
            _end = unread;
        }

        while (_end - _start < bytes && _end < _bytes.Length)
        {
            int got = _stream.Read(_bytes, _end, _bytes.Length - _end);
            if (got == 0)
            {
                _streamEnded = true;
                return;
            }

            _end += got;
        }
    }

    /// <summary>Marks <paramref name="bytes"/> bytes from <see cref="Start"/> as read (only at a line start, whole lines).</summary>
    public void Advance(int bytes) => _start += bytes;

    /// <inheritdoc/>
    public override int Peek()
    {
        if (_charPos == _charLen && !DecodeMore())
        {
            return -1;
        }

        return _chars[_charPos];
    }

    /// <inheritdoc/>
    public override int Read()
    {
        if (_charPos == _charLen && !DecodeMore())
        {
            return -1;
        }

        return _chars[_charPos++];
    }

    /// <inheritdoc/>
    public override string? ReadLine()
    {
        StringBuilder? text = null;
        while (true)
        {
            if (_charPos == _charLen && !DecodeMore())
            {
                return text?.ToString();
            }

            int at = _chars.AsSpan(_charPos, _charLen - _charPos).IndexOfAny('\r', '\n');
            if (at < 0)
            {
                text ??= new StringBuilder();
                text.Append(_chars, _charPos, _charLen - _charPos);
                _charPos = _charLen;
                continue;
            }

            string line = text == null
                ? new string(_chars, _charPos, at)
                : text.Append(_chars, _charPos, at).ToString();
            char ending = _chars[_charPos + at];
            _charPos += at + 1;
            if (ending == '\r' && (_charPos < _charLen || DecodeMore()) && _chars[_charPos] == '\n')
            {
                _charPos++;
            }

            return line;
        }
    }

    /// <inheritdoc/>
    protected override void Dispose(bool disposing)
    {
        if (disposing && !_leaveOpen)
        {
            _stream.Dispose();
        }

        base.Dispose(disposing);
    }

    /// <summary>Decodes the next bytes (up to and including the next '\n' byte) into the character buffer; false at the end.</summary>
    private bool DecodeMore()
    {
        _charPos = 0;
        _charLen = 0;
        while (_charLen == 0)
        {
            if (_start == _end)
            {
                Fill(1);
            }

            if (_start == _end)
            {
                if (_flushed)
                {
                    return false;
                }

                _flushed = true;
                _charLen = _decoder.GetChars(ReadOnlySpan<byte>.Empty, _chars, flush: true);
                _midLine = false;
                return _charLen > 0;
            }

            int window = Math.Min(_end - _start, MaxDecodeBytes);
            int newline = _bytes.AsSpan(_start, window).IndexOf((byte)'\n');
            int take = newline >= 0 ? newline + 1 : window;
            _charLen = _decoder.GetChars(_bytes.AsSpan(_start, take), _chars, flush: false);
            _start += take;
            _midLine = newline < 0;
        }

        return true;
    }
}
