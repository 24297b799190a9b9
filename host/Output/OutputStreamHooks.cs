namespace FreqReadout.Host.Output;

/// <summary>Holds the <see cref="IOutputStreamHook"/> of the current async flow (tests inject write failures through it).</summary>
internal static class OutputStreamHooks
{
    private static readonly AsyncLocal<IOutputStreamHook?> s_current = new();

    /// <summary>Installs <paramref name="hook"/> until the returned scope is disposed.</summary>
    public static IDisposable Install(IOutputStreamHook hook)
    {
        IOutputStreamHook? previous = s_current.Value;
        s_current.Value = hook;
        return new Scope(previous);
    }

    /// <summary>The stream to write to: <paramref name="stream"/>, wrapped by the installed hook if any.</summary>
    public static Stream Apply(OutputFile file, Stream stream) => s_current.Value?.Wrap(file, stream) ?? stream;

    private sealed class Scope : IDisposable
    {
        private readonly IOutputStreamHook? _previous;

        public Scope(IOutputStreamHook? previous) => _previous = previous;

        public void Dispose() => s_current.Value = _previous;
    }
}
