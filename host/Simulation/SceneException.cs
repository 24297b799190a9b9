namespace FreqReadout.Host.Simulation;

/// <summary>A scene that cannot be simulated: names the file (when there is one), the setting and its allowed range.</summary>
public sealed class SceneException : Exception
{
    public SceneException(string message)
        : base(message)
    {
    }

    public SceneException(string message, Exception inner)
        : base(message, inner)
    {
    }

    /// <summary>True when the command line is at fault (an option's value), not a scene file: a usage error, not a data error.</summary>
    public bool CommandLine { get; init; }

    /// <summary>A scene problem caused by an option's value (<see cref="CommandLine"/> set).</summary>
    public static SceneException Usage(string message) => new(message) { CommandLine = true };
}
