using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Commands;

/// <summary>Opens the capture writer for <c>simulate</c> (text or binary, through <see cref="CaptureFile.Create(Stream, CaptureMetadata, CaptureFileFormat)"/>) on an output's stream.</summary>
internal static class CaptureOutput
{
    /// <summary>Creates a writer for <paramref name="format"/> ("text" or "binary"); throws <see cref="ArgumentException"/> naming the option.</summary>
    public static ICaptureWriter Create(Stream stream, CaptureMetadata metadata, string format)
    {
        return format switch
        {
            "text" => CaptureFile.Create(stream, metadata, CaptureFileFormat.Text),
            "binary" => CaptureFile.Create(stream, metadata, CaptureFileFormat.Binary),
            _ => throw new ArgumentException($"--format must be text or binary (got {format})"),
        };
    }
}
