namespace FreqReadout.Host.Recording;

/// <summary>The trailer keys a recording writes (docs/capture-text-format.md, "Trailer of a recording").</summary>
public static class RecordingTrailerKeys
{
    /// <summary>Why the capture closed: stop, device reset, link lost, interrupted.</summary>
    public const string ClosedBy = "closed_by";

    /// <summary>Frames received intact while the capture was open.</summary>
    public const string LinkFrames = "link_frames";

    /// <summary>Frames whose CRC failed.</summary>
    public const string LinkCrcErrors = "link_crc_errors";

    /// <summary>Stretches that were not frames (garbage, cut frames).</summary>
    public const string LinkMalformed = "link_malformed";

    /// <summary>Frames missing by their sequence numbers.</summary>
    public const string LinkSequenceGaps = "link_sequence_gaps";

    /// <summary>Intact frames whose payload did not read (a layout this version does not know, or damage the CRC missed).</summary>
    public const string LinkBadPayloads = "link_bad_payloads";

    /// <summary>The device's boot id.</summary>
    public const string DeviceBootId = "device_boot_id";

    /// <summary>Reads the device took (last status).</summary>
    public const string DeviceReads = "device_reads";

    /// <summary>Reads the device dropped (a step no counter wrap explains).</summary>
    public const string DeviceReadsDropped = "device_reads_dropped";

    /// <summary>Reads mended after racing the counter's overflow interrupt.</summary>
    public const string DeviceWrapsMended = "device_wraps_mended";

    /// <summary>Stalls of the device's loop.</summary>
    public const string DeviceStalls = "device_stalls";

    /// <summary>Longest gap between two reads, µs.</summary>
    public const string DeviceLongestGapMicroseconds = "device_longest_gap_us";

    /// <summary>Read deadlines skipped.</summary>
    public const string DeviceMissedDeadlines = "device_missed_deadlines";

    /// <summary>Frames the device dropped because its send queue was full.</summary>
    public const string DeviceFramesLost = "device_frames_lost";

    /// <summary>Timer or count values the device refused.</summary>
    public const string DeviceRejectedTicks = "device_rejected_ticks";

    /// <summary>Detection events the device reported while the capture was open.</summary>
    public const string DeviceEvents = "device_events";

    /// <summary>Rows received before any capture header (not in any capture).</summary>
    public const string RowsBeforeHeader = "rows_before_header";
}
