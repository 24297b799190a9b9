namespace FreqReadout.Host.Commands;

/// <summary>
/// Marks a setting that holds a file (or folder) path. The command line is checked before the command runs
/// (<see cref="MissingValueInterceptor"/>): an empty path is a usage error naming the option, and <c>-</c> is accepted
/// only where <see cref="StandardInput"/> is true (it then means standard input).
/// </summary>
[AttributeUsage(AttributeTargets.Property)]
public sealed class FilePathAttribute : Attribute
{
    /// <summary>True when <c>-</c> may be given for standard input.</summary>
    public bool StandardInput { get; init; }
}
