namespace FreqReadout.Host.Commands;

/// <summary>
/// Short, user-facing reasons for a file that cannot be opened or written, instead of the runtime's
/// messages (a directory given as a file otherwise reads "Access to the path is denied").
/// </summary>
public static class FileErrorText
{
    /// <summary>Why <paramref name="path"/> could not be used, e.g. "is a directory, expected a file".</summary>
    public static string Reason(string path, Exception error)
    {
        if (Directory.Exists(path))
        {
            return "is a directory, expected a file";
        }

        return error switch
        {
            FileNotFoundException => "no such file",
            DirectoryNotFoundException => "its folder does not exist",
            UnauthorizedAccessException => "permission denied",
            PathTooLongException => "the path is too long",
            IOException when IsDiskFull(error) => "the disk is full (no space left on the device)",
            _ => error.Message.TrimEnd('.'),
        };
    }

    /// <summary>
    /// True for "no space left on the device": errno ENOSPC (28 on Linux and macOS; .NET puts the errno
    /// in HResult) or Windows ERROR_DISK_FULL (112) / ERROR_HANDLE_DISK_FULL (39) as an HRESULT.
    /// </summary>
    public static bool IsDiskFull(Exception error)
    {
        int code = error.HResult;
        return OperatingSystem.IsWindows()
            ? code == unchecked((int)0x80070070) || code == unchecked((int)0x80070027)
            : code == 28;
    }
}
