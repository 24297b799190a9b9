using System.Globalization;
using FreqReadout.Host.Captures;
using FreqReadout.Host.Output;
using FreqReadout.Link;

namespace FreqReadout.Host.Recording;

/// <summary>
/// Turns link frames (docs/link-protocol.md) into capture files as they arrive. A capture header begins a capture, whose
/// file is created with its first row (the file given, then <c>NAME-2.EXT</c>, <c>NAME-3.EXT</c>... after each device
/// reset; a device that sends no rows leaves no empty file), written in place through
/// <see cref="OutputFileSet"/>'s recording mode: rows reach the file at every batch, an existing file is refused, and
/// whatever happens the file keeps every row received. A new boot id (in a header or a status frame) closes the capture
/// and waits for the next header. Rows that arrive before any header are counted, not written, and
/// <see cref="HeaderWanted"/> asks the caller to request one. Closing writes the trailer: why it closed, what the link
/// lost while it was open (CRC failures, malformed stretches, sequence gaps, unreadable payloads) and the device's own
/// counts from its last status frame (reads dropped, wraps mended, stalls, frames it could not queue).
/// </summary>
public sealed class LinkCaptureRecorder : IDisposable
{
    /// <summary>The <c>closed_by</c> of a capture closed because the device restarted.</summary>
    public const string DeviceReset = "device reset";

    private readonly string _outputPath;
    private readonly string _source;
    private readonly IRecordingObserver _observer;
    private readonly TimeProvider _time;
    private readonly LinkPayloadReader _reader = new();
    private readonly CaptureHeaderPayload _header = new();
    private readonly CaptureHeaderPayload _known = new();
    private bool _haveHeader;
    private LinkCounts _countsAtHeader;
    private readonly SnapshotBatchPayload _snapshots = new();
    private readonly EdgeBatchPayload _edges = new();
    private readonly ReadingPayload _reading = new();
    private readonly EventPayload _event = new();
    private readonly TemperaturePayload _temperature = new();
    private readonly StatusPayload _status = new();
    private readonly List<string> _captures = new();
    private OpenCapture? _open;
    private long _rowsBeforeHeader;
    private long _badPayloads;
    private uint? _closedBootId;

    /// <summary>A recorder writing to <paramref name="outputPath"/> (and numbered siblings after device resets).</summary>
    /// <param name="outputPath">The first capture's path.</param>
    /// <param name="source">Where the frames come from (the serial port), for the capture's note.</param>
    /// <param name="observer">Told of captures, readings, events, status and settings.</param>
    /// <param name="time">The clock for <c>started_utc</c>; <see cref="TimeProvider.System"/> when null.</param>
    public LinkCaptureRecorder(string outputPath, string source, IRecordingObserver observer, TimeProvider? time = null)
    {
        _outputPath = outputPath;
        _source = source;
        _observer = observer;
        _time = time ?? TimeProvider.System;
    }

    /// <summary>Paths of the captures opened so far, in order.</summary>
    public IReadOnlyList<string> Captures => _captures;

    /// <summary>True while no capture is open and frames show a device is sending: the caller should request a header.</summary>
    public bool HeaderWanted { get; private set; }

    /// <summary>Rows written to all captures.</summary>
    public long RowsWritten { get; private set; }

    /// <summary>Rows received while no capture was open.</summary>
    public long RowsBeforeHeader => _rowsBeforeHeader;

    /// <summary>The settings text the device last sent, if any.</summary>
    public string? LastSettingsText { get; private set; }

    /// <summary>Takes one frame. <paramref name="decoder"/> is the one that delivered it (its counts go into the trailer).</summary>
    /// <exception cref="OutputFileException">A capture file could not be created or written (the message names it).</exception>
    public void Accept(LinkFrame frame, LinkFrameDecoder decoder)
    {
        _reader.Reset(frame.Payload, frame.PayloadLength);
        switch (frame.FrameType)
        {
            case LinkFrameType.CaptureHeader:
                if (!_header.TryRead(_reader))
                {
                    BadPayload();
                    return;
                }

                if (_open != null && !_open.Matches(_header))
                {
                    CloseOpen(_open.BootId != _header.BootId ? DeviceReset : "new capture header", decoder);
                }

                if (_open == null && !(_haveHeader && OpenCapture.SameCapture(_known, _header)))
                {
                    // The capture starts at this header; its file is created with the first row (no empty files).
                    OpenCapture.CopyHeader(_header, _known);
                    _haveHeader = true;
                    _countsAtHeader = new LinkCounts(decoder.Frames - 1, decoder.CrcErrors, decoder.Malformed, decoder.SequenceGaps, _badPayloads);
                }

                HeaderWanted = false;
                return;
            case LinkFrameType.SnapshotBatch:
                if (!_snapshots.TryRead(_reader))
                {
                    BadPayload();
                    return;
                }

                if (!TryOpenFor(snapshots: true, decoder))
                {
                    RowsWithoutCapture(_snapshots.Count);
                    return;
                }

                for (int i = 0; i < _snapshots.Count; i++)
                {
                    WriteRow(_snapshots.TickAt(i), _snapshots.CountAt(i));
                }

                _open.Writer.Flush();
                return;
            case LinkFrameType.EdgeBatch:
                if (!_edges.TryRead(_reader))
                {
                    BadPayload();
                    return;
                }

                if (!TryOpenFor(snapshots: false, decoder))
                {
                    RowsWithoutCapture(_edges.Count);
                    return;
                }

                for (int i = 0; i < _edges.Count; i++)
                {
                    WriteRow(_edges.TickAt(i), 0);
                }

                _open.Writer.Flush();
                return;
            case LinkFrameType.Reading:
                if (!_reading.TryRead(_reader))
                {
                    BadPayload();
                    return;
                }

                _observer.ReadingReceived(_reading);
                return;
            case LinkFrameType.Event:
                if (!_event.TryRead(_reader))
                {
                    BadPayload();
                    return;
                }

                if (_open != null)
                {
                    _open.Events++;
                }

                _observer.EventReceived(_event);
                return;
            case LinkFrameType.Temperature:
                if (!_temperature.TryRead(_reader))
                {
                    BadPayload();
                    return;
                }

                _open?.PendingTemperatures.Add(new KeyValuePair<long, double>(_temperature.Tick, _temperature.TemperatureC));
                return;
            case LinkFrameType.Status:
                if (!_status.TryRead(_reader))
                {
                    BadPayload();
                    return;
                }

                if (_open != null && _status.BootId != _open.BootId)
                {
                    CloseOpen(DeviceReset, decoder);
                }

                if (_haveHeader && _known.BootId != _status.BootId)
                {
                    _haveHeader = false;    // that header was of the device before it restarted
                }

                if (_open != null)
                {
                    _open.Status ??= new StatusPayload();
                    Copy(_status, _open.Status);
                }
                else if (!_haveHeader && _closedBootId != _status.BootId)
                {
                    HeaderWanted = true;
                }

                _observer.StatusReceived(_status);
                return;
            case LinkFrameType.Settings:
                _reader.TryReadAscii(out string text);
                LastSettingsText = text;
                _observer.SettingsReceived(text);
                return;
            default:
                BadPayload();    // a type this version does not know (or one only the PC sends)
                return;
        }
    }

    /// <summary>Closes the open capture, if any, writing its trailer with <c>closed_by</c> = <paramref name="why"/>.</summary>
    public void Close(string why, LinkFrameDecoder decoder)
    {
        if (_open != null)
        {
            CloseOpen(why, decoder);
        }
    }

    /// <summary>Forces the open capture's bytes to the disk (call it now and then: every second is plenty).</summary>
    public void FlushToDisk()
    {
        if (_open != null)
        {
            _open.Writer.Flush();
            _open.File.FlushToDisk();
        }
    }

    /// <summary>Releases the open capture's file without a trailer (what was written stays).</summary>
    public void Dispose()
    {
        _open?.Dispose();
        _open = null;
    }

    /// <summary>The path of capture <paramref name="number"/> (1-based): the path given, then NAME-N.EXT.</summary>
    public static string CapturePath(string outputPath, int number)
    {
        if (number <= 1)
        {
            return outputPath;
        }

        string folder = Path.GetDirectoryName(outputPath) ?? string.Empty;
        string name = Path.GetFileNameWithoutExtension(outputPath);
        string extension = Path.GetExtension(outputPath);
        return Path.Combine(folder, name + "-" + number.ToString(CultureInfo.InvariantCulture) + extension);
    }

    /// <summary>Opens the capture the last header announced when rows of its kind arrive; true when a capture of that kind is open.</summary>
    [System.Diagnostics.CodeAnalysis.MemberNotNullWhen(true, nameof(_open))]
    private bool TryOpenFor(bool snapshots, LinkFrameDecoder decoder)
    {
        if (_open == null && _haveHeader && _known.Snapshots == snapshots)
        {
            Open();
        }

        return _open != null && _open.Snapshots == snapshots;
    }

    private void Open()
    {
        string path = CapturePath(_outputPath, _captures.Count + 1);
        var metadata = new CaptureMetadata
        {
            ClockHz = _known.ClockHz,
            Kind = _known.Snapshots ? CaptureKind.Snapshots : CaptureKind.Edges,
            Prescale = (int)Math.Min(_known.Prescale, CaptureMetadata.MaxPrescale),
            TimerBits = _known.TimerBits,
            CountBits = _known.CountBits,
            Signal = _known.Signal,
            BeatSide = _known.BeatSide,
            SearchHz = _known.SearchHz > 0 ? _known.SearchHz : null,
            StartedUtc = TruncateToSeconds(_time.GetUtcNow()),
            Note = $"recorded by freqreadout record from {_source}, device boot id {_known.BootId.ToString(CultureInfo.InvariantCulture)}",
        };
        metadata.ExtraColumns.Add(CaptureColumns.TemperatureC);

        var outputs = new OutputFileSet();
        try
        {
            OutputFile file = outputs.AddOutput("--out", path, "the recording", OutputWriteMode.Recording);
            if (!outputs.TryPrepare(out OutputFileException? problem))
            {
                throw problem!;
            }

            var writer = new TextCaptureWriter(file.Stream, metadata, leaveOpen: true);
            _open = new OpenCapture(outputs, file, writer, path, _known, _countsAtHeader, _rowsBeforeHeader);
        }
        catch
        {
            outputs.Dispose();
            throw;
        }

        _captures.Add(path);
        HeaderWanted = false;
        _closedBootId = null;
        _observer.CaptureOpened(path, _known);
    }

    private void CloseOpen(string why, LinkFrameDecoder decoder)
    {
        OpenCapture open = _open!;
        _open = null;
        try
        {
            var trailer = new List<KeyValuePair<string, string>>
            {
                Pair(RecordingTrailerKeys.ClosedBy, why),
                Pair(RecordingTrailerKeys.LinkFrames, decoder.Frames - open.FramesAtOpen),
                Pair(RecordingTrailerKeys.LinkCrcErrors, decoder.CrcErrors - open.CrcErrorsAtOpen),
                Pair(RecordingTrailerKeys.LinkMalformed, decoder.Malformed - open.MalformedAtOpen),
                // A restarted device numbers its frames from 0 again: the jump to its first frame is not a loss.
                Pair(RecordingTrailerKeys.LinkSequenceGaps, decoder.SequenceGaps - open.GapsAtOpen - (why == DeviceReset ? decoder.LastGap : 0)),
                Pair(RecordingTrailerKeys.LinkBadPayloads, _badPayloads - open.BadPayloadsAtOpen),
                Pair(RecordingTrailerKeys.DeviceBootId, open.BootId),
                Pair(RecordingTrailerKeys.DeviceEvents, open.Events),
            };
            if (open.RowsBeforeHeaderAtOpen > 0)
            {
                trailer.Add(Pair(RecordingTrailerKeys.RowsBeforeHeader, open.RowsBeforeHeaderAtOpen));
            }

            if (open.Status is StatusPayload s)
            {
                trailer.Add(Pair(RecordingTrailerKeys.DeviceReads, s.Reads));
                trailer.Add(Pair(RecordingTrailerKeys.DeviceReadsDropped, s.ReadsDropped));
                trailer.Add(Pair(RecordingTrailerKeys.DeviceWrapsMended, s.WrapsMended));
                trailer.Add(Pair(RecordingTrailerKeys.DeviceStalls, s.Stalls));
                trailer.Add(Pair(RecordingTrailerKeys.DeviceLongestGapMicroseconds, s.LongestGapMicroseconds));
                trailer.Add(Pair(RecordingTrailerKeys.DeviceMissedDeadlines, s.MissedDeadlines));
                trailer.Add(Pair(RecordingTrailerKeys.DeviceFramesLost, s.FramesLost));
                trailer.Add(Pair(RecordingTrailerKeys.DeviceRejectedTicks, s.RejectedTicks));
            }

            open.Writer.Complete(trailer);
            open.ReleaseWriter();
            open.Outputs.Commit();
            _closedBootId = open.BootId;
            _haveHeader = false;
            _observer.CaptureClosed(open.Path, open.Rows, why);
        }
        finally
        {
            open.Dispose();
        }
    }

    private void WriteRow(long tick, long count)
    {
        OpenCapture open = _open!;
        if (open.Rows > 0 && tick <= open.LastTick)
        {
            _badPayloads++;    // a row that goes back in time cannot follow; counted with the unreadable payloads
            return;
        }

        double? temperature = null;
        while (open.PendingTemperatures.Count > 0 && open.PendingTemperatures[0].Key <= tick)
        {
            temperature = open.PendingTemperatures[0].Value;
            open.PendingTemperatures.RemoveAt(0);
        }

        open.Writer.WriteRow(new CaptureRow(0, (ulong)tick, (ulong)count, temperature, null));
        open.LastTick = tick;
        open.Rows++;
        RowsWritten++;
    }

    private void RowsWithoutCapture(int rows)
    {
        _rowsBeforeHeader += rows;
        HeaderWanted = true;
    }

    private void BadPayload() => _badPayloads++;

    private static DateTimeOffset TruncateToSeconds(DateTimeOffset t) => new(t.Ticks - (t.Ticks % TimeSpan.TicksPerSecond), TimeSpan.Zero);

    private static KeyValuePair<string, string> Pair(string key, string value) => new(key, value);

    private static KeyValuePair<string, string> Pair(string key, long value) => new(key, value.ToString(CultureInfo.InvariantCulture));

    private static void Copy(StatusPayload from, StatusPayload to)
    {
        to.BootId = from.BootId;
        to.UptimeMicroseconds = from.UptimeMicroseconds;
        to.Reads = from.Reads;
        to.ReadsDropped = from.ReadsDropped;
        to.WrapsMended = from.WrapsMended;
        to.Stalls = from.Stalls;
        to.LongestGapMicroseconds = from.LongestGapMicroseconds;
        to.MissedDeadlines = from.MissedDeadlines;
        to.FramesLost = from.FramesLost;
        to.RejectedTicks = from.RejectedTicks;
        to.SettingsCheck = from.SettingsCheck;
        to.SettingsProblems = from.SettingsProblems;
        to.HoldActive = from.HoldActive;
    }

    /// <summary>The link's counts at a moment (when a capture header arrived).</summary>
    private readonly record struct LinkCounts(long Frames, long CrcErrors, long Malformed, long SequenceGaps, long BadPayloads);

    /// <summary>One capture being written.</summary>
    private sealed class OpenCapture : IDisposable
    {
        private readonly double _clockHz;
        private readonly uint _prescale;
        private readonly int _signal;
        private readonly int _side;
        private readonly double _searchHz;
        private bool _writerReleased;

        public OpenCapture(OutputFileSet outputs, OutputFile file, TextCaptureWriter writer, string path, CaptureHeaderPayload header, LinkCounts atHeader, long rowsBeforeHeader)
        {
            Outputs = outputs;
            File = file;
            Writer = writer;
            Path = path;
            BootId = header.BootId;
            Snapshots = header.Snapshots;
            _clockHz = header.ClockHz;
            _prescale = header.Prescale;
            _signal = (int)header.Signal;
            _side = (int)header.BeatSide;
            _searchHz = header.SearchHz;
            FramesAtOpen = atHeader.Frames;    // counted from the header that began it (included)
            CrcErrorsAtOpen = atHeader.CrcErrors;
            MalformedAtOpen = atHeader.Malformed;
            GapsAtOpen = atHeader.SequenceGaps;
            BadPayloadsAtOpen = atHeader.BadPayloads;
            RowsBeforeHeaderAtOpen = rowsBeforeHeader;
        }

        public OutputFileSet Outputs { get; }

        public OutputFile File { get; }

        public TextCaptureWriter Writer { get; }

        public string Path { get; }

        public uint BootId { get; }

        public bool Snapshots { get; }

        public long FramesAtOpen { get; }

        public long CrcErrorsAtOpen { get; }

        public long MalformedAtOpen { get; }

        public long GapsAtOpen { get; }

        public long BadPayloadsAtOpen { get; }

        public long RowsBeforeHeaderAtOpen { get; }

        public long Rows { get; set; }

        public long LastTick { get; set; }

        public long Events { get; set; }

        public StatusPayload? Status { get; set; }

        public List<KeyValuePair<long, double>> PendingTemperatures { get; } = new();

        /// <summary>True when two headers describe the same capture (same boot, kind, clock, prescale, signal, side, search frequency).</summary>
        public static bool SameCapture(CaptureHeaderPayload a, CaptureHeaderPayload b) =>
            a.BootId == b.BootId && a.Snapshots == b.Snapshots && a.ClockHz == b.ClockHz && a.Prescale == b.Prescale
            && a.Signal == b.Signal && a.BeatSide == b.BeatSide && a.SearchHz == b.SearchHz;

        /// <summary>Copies every field of a header.</summary>
        public static void CopyHeader(CaptureHeaderPayload from, CaptureHeaderPayload to)
        {
            to.BootId = from.BootId;
            to.Snapshots = from.Snapshots;
            to.ClockHz = from.ClockHz;
            to.Prescale = from.Prescale;
            to.TimerBits = from.TimerBits;
            to.CountBits = from.CountBits;
            to.Signal = from.Signal;
            to.BeatSide = from.BeatSide;
            to.SearchHz = from.SearchHz;
        }

        public bool Matches(CaptureHeaderPayload header) =>
            header.BootId == BootId && header.Snapshots == Snapshots && header.ClockHz == _clockHz && header.Prescale == _prescale
            && (int)header.Signal == _signal && (int)header.BeatSide == _side && header.SearchHz == _searchHz;

        /// <summary>Flushes and lets go of the text writer (the file stays open for the output set's commit).</summary>
        public void ReleaseWriter()
        {
            if (!_writerReleased)
            {
                _writerReleased = true;
                Writer.Dispose();
            }
        }

        public void Dispose()
        {
            try
            {
                ReleaseWriter();
            }
            finally
            {
                Outputs.Dispose();
            }
        }
    }
}
