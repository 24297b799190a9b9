using FreqReadout.Host.Captures;

namespace FreqReadout.Host.Commands;

/// <summary>Opens the capture writer for <c>simulate</c> (text or binary, through <see cref="CaptureFile.Create(string, CaptureMetadata, CaptureFileFormat)"/>).</summary>
internal static class CaptureOutput
{
    /// <summary>Creates a writer for <paramref name="format"/> ("text" or "binary"); throws <see cref="ArgumentException"/> naming the option.</summary>
    public static ICaptureWriter Create(string path, CaptureMetadata metadata, string format)
    {
        return format switch
        {
            "text" => CaptureFile.Create(path, metadata, CaptureFileFormat.Text),
            "binary" => CaptureFile.Create(path, metadata, CaptureFileFormat.Binary),
            _ => throw new ArgumentException($"--format must be text or binary (got {format})"),
        };
    }
}
