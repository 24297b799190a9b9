namespace FreqReadout.Firmware.Device
{
    /// <summary>What the board delivers to the device loop.</summary>
    public enum InputKind
    {
        /// <summary>Timestamped edges from an <see cref="Ports.IEdgeSource"/>.</summary>
        Edges = 0,

        /// <summary>Pulse-counter snapshots from an <see cref="Ports.IPulseCounterPort"/>.</summary>
        Snapshots = 1,
    }
}
