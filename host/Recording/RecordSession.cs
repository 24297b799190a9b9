using FreqReadout.Link;

namespace FreqReadout.Host.Recording;

/// <summary>
/// Runs the PC's side of the link over a channel: reads bytes, decodes frames (<see cref="LinkFrameDecoder"/>, which
/// resynchronises after garbage), hands each to the <see cref="LinkCaptureRecorder"/> when recording, forces the capture
/// to the disk every second, asks the device for a capture header when the recorder waits for one (at most once a
/// second), and sends settings and waits for the status frame that confirms them.
/// </summary>
public sealed class RecordSession
{
    private static readonly TimeSpan Second = TimeSpan.FromSeconds(1);

    private readonly ILinkChannel _channel;
    private readonly LinkCaptureRecorder? _recorder;
    private readonly TimeProvider _time;
    private readonly LinkFrameDecoder _decoder = new();
    private readonly LinkFrame _frame = new();
    private readonly LinkFrameEncoder _encoder = new();
    private readonly LinkPayloadWriter _payload = new();
    private readonly LinkPayloadReader _reader = new();
    private readonly StatusPayload _status = new();
    private readonly RequestPayload _request = new();
    private readonly byte[] _buffer = new byte[4096];
    private readonly byte[] _wire = new byte[LinkFrameEncoder.MaxWireBytes];
    private long _lastFlush;
    private long _lastRequest;
    private bool _requested;
    private bool _askedWhySilent;
    private readonly long _started;

    /// <summary>A session over <paramref name="channel"/>, recording when <paramref name="recorder"/> is given.</summary>
    public RecordSession(ILinkChannel channel, LinkCaptureRecorder? recorder, TimeProvider? time = null)
    {
        _channel = channel;
        _recorder = recorder;
        _time = time ?? TimeProvider.System;
        _lastFlush = _time.GetTimestamp();
        _started = _lastFlush;
    }

    /// <summary>After this long without a frame the session asks the device for its settings and status (a device whose link setting is off sends only what it is asked for).</summary>
    public static readonly TimeSpan SilenceBeforeAsking = TimeSpan.FromSeconds(2);

    /// <summary>The frame decoder (its counts: frames, CRC errors, malformed stretches, sequence gaps).</summary>
    public LinkFrameDecoder Decoder => _decoder;

    /// <summary>Bytes received.</summary>
    public long BytesReceived { get; private set; }

    /// <summary>True once any status frame arrived; <see cref="LastStatus"/> then holds the latest.</summary>
    public bool HasStatus { get; private set; }

    /// <summary>The check of the last settings text sent (what the device's status frame should report once it took them).</summary>
    public uint SentSettingsCheck { get; private set; }

    /// <summary>The latest status frame.</summary>
    public StatusPayload LastStatus => _status;

    /// <summary>
    /// Reads and records until <paramref name="cancellationToken"/> is cancelled (Ctrl+C: a normal stop) or
    /// <paramref name="limit"/> has passed; returns why it stopped, for the trailer's <c>closed_by</c>.
    /// </summary>
    /// <exception cref="IOException">The channel failed (the capture stays open for the caller to close as "link lost").</exception>
    public string Run(TimeSpan? limit, CancellationToken cancellationToken)
    {
        long start = _time.GetTimestamp();
        while (true)
        {
            if (cancellationToken.IsCancellationRequested)
            {
                return "stopped";
            }

            if (limit is TimeSpan l && _time.GetElapsedTime(start) >= l)
            {
                return "time limit";
            }

            Pump();
        }
    }

    /// <summary>
    /// Sends a settings text (ASCII, at most <see cref="LinkFrameEncoder.MaxPayloadBytes"/> bytes) and asks for the
    /// status; true when, within <paramref name="timeout"/>, a status frame arrived whose settings check is the
    /// CRC-32 (FrameCrc) of the text sent (the device took the settings). Frames keep being recorded meanwhile.
    /// </summary>
    public bool TrySendSettings(string text, TimeSpan timeout, CancellationToken cancellationToken)
    {
        _payload.Reset();
        _payload.WriteAscii(text);
        if (_payload.Overflowed)
        {
            throw new ArgumentException($"the settings text is {text.Length} bytes; a frame holds at most {LinkFrameEncoder.MaxPayloadBytes}", nameof(text));
        }

        uint expected = FrameCrc.Compute(_payload.Buffer, 0, _payload.Length);
        SentSettingsCheck = expected;
        Send(LinkFrameType.Settings);
        long start = _time.GetTimestamp();
        long lastAsk = long.MinValue;
        while (!cancellationToken.IsCancellationRequested && _time.GetElapsedTime(start) < timeout)
        {
            if (lastAsk == long.MinValue || _time.GetElapsedTime(lastAsk) >= Second)
            {
                lastAsk = _time.GetTimestamp();
                _request.WantedType = LinkFrameType.Status;
                _payload.Reset();
                _request.Write(_payload);
                Send(LinkFrameType.Request);
            }

            if (Pump() && _status.SettingsCheck == expected)
            {
                return true;
            }
        }

        return false;
    }

    /// <summary>Reads once (waiting at most the channel's timeout) and handles the frames; true when a status frame arrived.</summary>
    private bool Pump()
    {
        bool gotStatus = false;
        if (_channel.TryRead(_buffer, 0, _buffer.Length, out int read))
        {
            BytesReceived += read;
            for (int i = 0; i < read; i++)
            {
                if (_decoder.Push(_buffer[i], _frame))
                {
                    gotStatus |= Take(_frame);
                }
            }
        }

        if (_recorder != null)
        {
            if (_time.GetElapsedTime(_lastFlush) >= Second)
            {
                _lastFlush = _time.GetTimestamp();
                _recorder.FlushToDisk();
            }

            if (!_askedWhySilent && _decoder.Frames == 0 && _time.GetElapsedTime(_started) >= SilenceBeforeAsking)
            {
                _askedWhySilent = true;
                foreach (int wanted in new[] { LinkFrameType.Settings, LinkFrameType.Status })
                {
                    _request.WantedType = wanted;
                    _payload.Reset();
                    _request.Write(_payload);
                    Send(LinkFrameType.Request);
                }
            }

            if (_recorder.HeaderWanted && (!_requested || _time.GetElapsedTime(_lastRequest) >= Second))
            {
                _requested = true;
                _lastRequest = _time.GetTimestamp();
                _request.WantedType = LinkFrameType.CaptureHeader;
                _payload.Reset();
                _request.Write(_payload);
                Send(LinkFrameType.Request);
            }
        }

        return gotStatus;
    }

    private bool Take(LinkFrame frame)
    {
        bool isStatus = false;
        if (frame.FrameType == LinkFrameType.Status)
        {
            _reader.Reset(frame.Payload, frame.PayloadLength);
            isStatus = _status.TryRead(_reader);
            HasStatus |= isStatus;
        }

        _recorder?.Accept(frame, _decoder);
        return isStatus;
    }

    private void Send(int frameType)
    {
        _encoder.TryEncode(frameType, _payload.Buffer, 0, _payload.Length, _wire, 0, out int written);
        _channel.Write(_wire, 0, written);
    }
}
