using FreqReadout.Firmware.Ports;

namespace FreqReadout.Firmware.Tests;

/// <summary>A small hand fake of the edge port: a queue of raw timer values, and a settable "now".</summary>
internal sealed class QueueEdgeSource : IEdgeSource, IClockPort
{
    private readonly Queue<ulong> pending = new();

    public ulong NowRaw { get; set; }

    public int Pending => pending.Count;

    public void Enqueue(ulong raw) => pending.Enqueue(raw);

    public bool TryReadEdge(out ulong rawTick) => pending.TryDequeue(out rawTick);

    public bool TryReadNow(out ulong rawTick)
    {
        rawTick = NowRaw;
        return true;
    }
}

/// <summary>A hand fake of the buttons that never reports a press (Moq records every call, which allocates).</summary>
internal sealed class IdleButtons : IButtonPort
{
    public bool TryTakeRebaselinePress() => false;

    public bool TryReadHold(out bool hold)
    {
        hold = false;
        return false;
    }
}
