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
}
