namespace FreqReadout.Tests.DeviceFit;

/// <summary>Which value of each declared loop bound a count uses.</summary>
internal enum CostProfile
{
    /// <summary>Every setting at its default.</summary>
    Defaults,

    /// <summary>Every setting at the largest value its TryValidate accepts.</summary>
    Limits,
}
