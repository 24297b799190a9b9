namespace FreqReadout.Host.Output;

/// <summary>
/// A test seam on the stream factory of <see cref="OutputFile"/>: wraps the stream each output
/// writes to (for example to fail with "no space left on device" after some bytes). Installed for
/// the current async flow only, through <see cref="OutputStreamHooks.Install"/>.
/// </summary>
internal interface IOutputStreamHook
{
    /// <summary>The stream <paramref name="file"/> should write to instead of <paramref name="stream"/>; return <paramref name="stream"/> to leave it alone.</summary>
    Stream Wrap(OutputFile file, Stream stream);
}
