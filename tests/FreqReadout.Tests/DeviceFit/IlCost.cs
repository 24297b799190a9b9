namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// A worst-case count of IL operations, with the calls out of the device assembly it contains
/// (mscorlib methods and port interfaces, each already counted at its stated constant) and, when a
/// loop on the way has no bound under the profile, the loop that leaves it unbounded.
/// </summary>
internal sealed class IlCost
{
    public long Ops { get; private set; }

    /// <summary>Key ("Type.Method#loop") of a loop whose bound has no limit; null when the count is finite.</summary>
    public string? UnboundedBy { get; private set; }

    public SortedDictionary<string, long> MscorlibCalls { get; } = new(StringComparer.Ordinal);

    public SortedDictionary<string, long> PortCalls { get; } = new(StringComparer.Ordinal);

    public void AddOps(long ops)
    {
        Ops = checked(Ops + ops);
    }

    public void MarkUnbounded(string loopKey)
    {
        UnboundedBy ??= loopKey;
    }

    public void AddCall(SortedDictionary<string, long> calls, string name, long times)
    {
        calls[name] = checked((calls.TryGetValue(name, out long n) ? n : 0) + times);
    }

    /// <summary>Adds <paramref name="times"/> copies of another cost.</summary>
    public void Add(IlCost other, long times)
    {
        Ops = checked(Ops + (other.Ops * times));
        if (other.UnboundedBy != null)
        {
            MarkUnbounded(other.UnboundedBy);
        }

        foreach (KeyValuePair<string, long> c in other.MscorlibCalls)
        {
            AddCall(MscorlibCalls, c.Key, checked(c.Value * times));
        }

        foreach (KeyValuePair<string, long> c in other.PortCalls)
        {
            AddCall(PortCalls, c.Key, checked(c.Value * times));
        }
    }
}
