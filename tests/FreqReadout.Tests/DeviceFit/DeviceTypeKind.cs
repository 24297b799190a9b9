namespace FreqReadout.Tests.DeviceFit;

/// <summary>What a type is to the device checks.</summary>
internal enum DeviceTypeKind
{
    /// <summary>bool, char, the integer types, float, double, IntPtr, UIntPtr.</summary>
    Primitive,

    /// <summary>A value type whose base is System.Enum.</summary>
    Enum,

    /// <summary>Any other value type (base System.ValueType): a heap object per local, per new and per copy on nanoCLR.</summary>
    Struct,

    /// <summary>Classes, interfaces, arrays, string, object.</summary>
    Reference,

    /// <summary>A managed or unmanaged pointer (ref locals, out/ref parameters); not a value of its own.</summary>
    Pointer,
}
