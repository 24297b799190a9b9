namespace FreqReadout.Host.Commands;

/// <summary>An option that takes a value was given without one.</summary>
public sealed class MissingOptionValueException : Exception
{
    /// <summary>The option as typed, e.g. <c>--threshold-sigma</c>.</summary>
    public string Option { get; }

    /// <summary>Creates the exception for <paramref name="option"/>.</summary>
    public MissingOptionValueException(string option)
        : base($"{option} needs a value")
    {
        Option = option;
    }
}
