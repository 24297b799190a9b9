namespace FreqReadout.Host.Link;

/// <summary>One frame of the capture link as the decoder delivers it (docs/link-protocol.md); the decoder fills it.</summary>
public sealed class LinkFrame
{
    /// <summary>Protocol version the frame was written with.</summary>
    public int Version { get; internal set; }

    /// <summary>Frame type, 1-255.</summary>
    public int FrameType { get; internal set; }

    /// <summary>Sequence number, 0-65535.</summary>
    public int Sequence { get; internal set; }

    /// <summary>The payload (its first <see cref="PayloadLength"/> bytes).</summary>
    public byte[] Payload { get; } = new byte[FreqReadout.Link.LinkFrameEncoder.MaxPayloadBytes];

    /// <summary>Bytes of payload.</summary>
    public int PayloadLength { get; internal set; }
}
