using FreqReadout.Host.Commands;

namespace FreqReadout.Host.Reports;

/// <summary>The folder of <c>--report DIR</c>, created before a command's work so a bad folder fails at once.</summary>
public static class ReportFolder
{
    /// <summary>Creates <paramref name="folder"/> when missing; false with "--report DIR: why" when it cannot be used.</summary>
    public static bool TryCreate(string folder, out string? error)
    {
        // A file where the folder (or one of its parents) should be: say so, rather than .NET's "already exists" or
        // "its folder does not exist".
        for (string? p = folder; !string.IsNullOrEmpty(p); p = Path.GetDirectoryName(p))
        {
            if (File.Exists(p))
            {
                error = p == folder
                    ? $"--report {folder}: is a file, expected a folder"
                    : $"--report {folder}: {p} is a file, not a folder";
                return false;
            }
        }

        try
        {
            Directory.CreateDirectory(folder);
            error = null;
            return true;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            error = $"--report {folder}: {FileErrorText.Reason(folder, e)}";
            return false;
        }
    }
}
