using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Commands;

/// <summary>Opens the capture writer for <c>simulate</c> (the one place that picks a concrete writer).</summary>
internal static class CaptureOutput
{
    /// <summary>Creates a writer for <paramref name="format"/> ("text" or "binary"); throws <see cref="ArgumentException"/> naming the option.</summary>
    public static ICaptureWriter Create(string path, CaptureMetadata metadata, string format)
    {
        switch (format)
        {
            case "text":
                return new InterimTextCaptureWriter(path, metadata);
            case "binary":
                throw new ArgumentException("--format binary: the binary capture writer is not on this branch yet (it lands with the capture formats); use --format text");
            default:
                throw new ArgumentException($"--format must be text or binary (got {format})");
        }
    }
}
