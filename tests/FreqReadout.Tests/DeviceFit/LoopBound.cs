namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// The declared bound of one loop: the most times its backward branch is taken per entry into the
/// loop, as the code it comes from states it. Keyed by method name (as <see cref="DeviceModule.MethodName"/>
/// gives it) and loop index (<see cref="IlLoop.Index"/>).
/// </summary>
internal sealed class LoopBound
{
    public LoopBound(string method, int loop, string expression, long atDefaults, long? atLimits)
    {
        Method = method;
        Loop = loop;
        Expression = expression;
        AtDefaults = atDefaults;
        AtLimits = atLimits;
    }

    public string Method { get; }

    public int Loop { get; }

    /// <summary>The bound in words, with the setting or constant it comes from.</summary>
    public string Expression { get; }

    /// <summary>The bound with every setting at its default.</summary>
    public long AtDefaults { get; }

    /// <summary>The bound with every setting at the largest value it may take; null when nothing limits it.</summary>
    public long? AtLimits { get; }

    public string Key => Method + "#" + Loop;

    public long? Value(CostProfile profile) => profile == CostProfile.Defaults ? AtDefaults : AtLimits;
}
