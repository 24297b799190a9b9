namespace FreqReadout.Tests.DeviceFit;

/// <summary>A type as seen in a signature or token, with its name (short, as C# writes it) and kind.</summary>
internal sealed class DeviceType
{
    public DeviceType(string name, DeviceTypeKind kind)
    {
        Name = name;
        Kind = kind;
    }

    public string Name { get; }

    public DeviceTypeKind Kind { get; }

    public override string ToString() => Name;
}
