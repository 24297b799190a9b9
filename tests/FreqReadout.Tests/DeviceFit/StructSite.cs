namespace FreqReadout.Tests.DeviceFit;

/// <summary>One place where a method holds or creates a struct: the method and what it does ("local of type Reading", "newobj GateResult", "initobj DetectionEvent").</summary>
internal sealed class StructSite
{
    public StructSite(string method, string what)
    {
        Method = method;
        What = what;
    }

    public string Method { get; }

    public string What { get; }

    public override string ToString() => Method + ": " + What;
}
