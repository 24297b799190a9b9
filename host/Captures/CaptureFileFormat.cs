namespace FreqReadout.Host.Captures;

/// <summary>The two capture file formats.</summary>
public enum CaptureFileFormat
{
    /// <summary>The capture text format of docs/capture-text-format.md (UTF-8 lines).</summary>
    Text,

    /// <summary>The compact binary format of hardware-notes/binary-capture-format.md (magic, CRC-32 blocks).</summary>
    Binary,
}
