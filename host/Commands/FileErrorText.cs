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
            _ => error.Message.TrimEnd('.'),
        };
    }
}
