using FreqReadout.Host.Commands;

namespace FreqReadout.Host.Output;

/// <summary>
/// One file a command writes, declared to an <see cref="OutputFileSet"/> before any work. After the
/// set is prepared, <see cref="Stream"/> takes the bytes: a regular file is written to a temporary
/// file beside its target (a symbolic link is followed to its target; an existing file's permission
/// bits are kept) and moved into place only when the set commits; a device, a pipe or standard
/// output (<c>-</c>) is written directly. Nothing the command did not create is ever deleted,
/// replaced or truncated before success. See <see cref="OutputWriteMode"/> for recordings.
/// </summary>
public sealed class OutputFile
{
    /// <summary>The path that names standard output.</summary>
    public const string StandardOutputPath = "-";

    private FileStream? _file;
    private Stream? _standardOutput;
    private GuardedOutputStream? _guarded;
    private string? _temporaryPath;
    private int _existingPermissionBits = -1;

    internal OutputFile(string label, string path, string what, OutputWriteMode mode)
    {
        Label = label;
        Path = path;
        What = what;
        Mode = mode;
        TargetPath = path;
    }

    /// <summary>How the command line names this output, e.g. <c>--readings</c> or <c>&lt;out&gt;</c>.</summary>
    public string Label { get; }

    /// <summary>The path as the user gave it (used in every message).</summary>
    public string Path { get; }

    /// <summary>What the file holds, for messages: "the capture", "the readings", ...</summary>
    public string What { get; }

    /// <summary>Replace on success (every command) or write in place (a recording).</summary>
    public OutputWriteMode Mode { get; }

    /// <summary>
    /// Set before the set is prepared when the command needs a regular file here (it reads the bytes
    /// back, say): why, for the message that refuses a device, a pipe or standard output.
    /// </summary>
    public string? RegularFileNeededBecause { get; set; }

    /// <summary>What the path turned out to be when the set was checked.</summary>
    public OutputTargetKind TargetKind { get; internal set; }

    /// <summary>The file really written: the full path with symbolic links followed to their final target.</summary>
    public string TargetPath { get; internal set; }

    /// <summary>True once the bytes are in place (committed), or for a recording once its file exists.</summary>
    public bool Committed { get; private set; }

    /// <summary>The stream to write to (valid after <see cref="OutputFileSet.TryPrepare"/>); disposing it only flushes.</summary>
    public Stream Stream => _guarded ?? throw new InvalidOperationException($"{Label} {Path}: the output set is not prepared");

    /// <summary>Bytes written so far.</summary>
    public long BytesWritten => _guarded?.BytesWritten ?? 0;

    /// <summary>
    /// Where the bytes written so far can be read back before the commit (the temporary file of a
    /// regular file, else the target itself); null for standard output, a pipe or a device.
    /// </summary>
    public string? ContentPath => TargetKind is OutputTargetKind.NewFile or OutputTargetKind.ExistingFile ? _temporaryPath ?? TargetPath : null;

    /// <summary>True for a regular file (its folder's free space matters); false for devices, pipes and standard output.</summary>
    public bool IsRegularFile => TargetKind is OutputTargetKind.NewFile or OutputTargetKind.ExistingFile;

    /// <summary>What became of the user's file when the command failed, for the end of an error line ("" when nothing is to be said).</summary>
    public string UnchangedNote => TargetKind switch
    {
        OutputTargetKind.ExistingFile when Mode == OutputWriteMode.ReplaceOnSuccess => $"{Path} is unchanged",
        OutputTargetKind.NewFile when Mode == OutputWriteMode.ReplaceOnSuccess => $"{Path} was not created",
        OutputTargetKind.NewFile => $"the partial recording is kept in {Path}",
        _ => string.Empty,
    };

    /// <summary>Free bytes for an unprivileged user in the folder the file is written to; false when unknown (devices, pipes, odd mounts).</summary>
    public bool TryGetFreeBytes(out long bytes)
    {
        bytes = 0;
        if (!IsRegularFile)
        {
            return false;
        }

        try
        {
            string folder = System.IO.Path.GetDirectoryName(TargetPath) ?? TargetPath;
            var drive = OperatingSystem.IsWindows() ? new DriveInfo(System.IO.Path.GetPathRoot(folder)!) : new DriveInfo(folder);
            bytes = drive.AvailableFreeSpace;
            return true;
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException)
        {
            return false;
        }
    }

    /// <summary>Forces what was written so far to the disk (a recording calls this now and then).</summary>
    public void FlushToDisk()
    {
        Stream.Flush();
        try
        {
            if (IsRegularFile)
            {
                _file?.Flush(flushToDisk: true);
            }
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw WriteFailure(e);
        }
    }

    /// <summary>The one-line error for a write that failed: path, what, why, and what became of the file.</summary>
    internal OutputFileException WriteFailure(Exception e)
    {
        string note = UnchangedNote;
        // The runtime's Unix messages end in " : 'path'", here often the temporary file's: the line names the user's path already.
        string reason = System.Text.RegularExpressions.Regex.Replace(FileErrorText.Reason(TargetPath, e), " : '[^']*'$", string.Empty);
        return new OutputFileException(
            $"{ShownPath}: cannot write {What}: {reason}" + (note.Length > 0 ? $" ({note})" : string.Empty),
            OutputFileException.FileExitCode,
            e);
    }

    /// <summary>The one-line error for an output that cannot be used at all (checked before any work).</summary>
    internal OutputFileException Refusal(string reason, int exitCode = OutputFileException.FileExitCode) =>
        new($"{ShownPath}: cannot write {What}: {reason}", exitCode);

    private string ShownPath => TargetKind == OutputTargetKind.StandardOutput ? "standard output" : Path;

    /// <summary>Opens the stream: the temporary file, the recording, the device or standard output.</summary>
    internal void Open()
    {
        Stream raw;
        switch (TargetKind)
        {
            case OutputTargetKind.StandardOutput:
                _standardOutput = Console.OpenStandardOutput();
                raw = _standardOutput;
                break;
            case OutputTargetKind.Device:
            case OutputTargetKind.Pipe:
                // Never created, truncated or deleted: opened as it is, for writing.
                _file = new FileStream(TargetPath, FileMode.Open, FileAccess.Write, FileShare.ReadWrite, 65536);
                raw = _file;
                break;
            case OutputTargetKind.NewFile when Mode == OutputWriteMode.Recording:
                _file = new FileStream(TargetPath, FileMode.CreateNew, FileAccess.Write, FileShare.Read, 65536);
                Committed = true; // the recording is the file itself from the first byte on
                raw = _file;
                break;
            case OutputTargetKind.NewFile:
            case OutputTargetKind.ExistingFile:
                raw = OpenTemporary();
                break;
            default:
                throw new InvalidOperationException($"{Label} {Path}: not checked");
        }

        _guarded = new GuardedOutputStream(this, OutputStreamHooks.Apply(this, raw));
    }

    private FileStream OpenTemporary()
    {
        if (TargetKind == OutputTargetKind.ExistingFile)
        {
            // A write-protected file stays protected: replacing it by a rename would get round that.
            using (new FileStream(TargetPath, FileMode.Open, FileAccess.Write, FileShare.ReadWrite | FileShare.Delete, 1))
            {
            }

            if (!OperatingSystem.IsWindows())
            {
                _existingPermissionBits = (int)File.GetUnixFileMode(TargetPath);
            }
        }

        string folder = System.IO.Path.GetDirectoryName(TargetPath)!;
        string name = System.IO.Path.GetFileName(TargetPath);
        for (int attempt = 0; ; attempt++)
        {
            string stem = name.Length > 100 ? name.Substring(0, 100) : name;
            string candidate = System.IO.Path.Combine(folder, $".{stem}.{Guid.NewGuid().ToString("N").Substring(0, 12)}.tmp");
            try
            {
                _file = new FileStream(candidate, FileMode.CreateNew, FileAccess.Write, FileShare.Read, 65536);
                _temporaryPath = candidate;
                break;
            }
            catch (IOException) when (attempt < 3 && File.Exists(candidate))
            {
                // A name clash with another run: try another random name.
            }
        }

        if (_existingPermissionBits >= 0 && !OperatingSystem.IsWindows())
        {
            File.SetUnixFileMode(_file.SafeFileHandle, (UnixFileMode)_existingPermissionBits);
        }

        return _file;
    }

    /// <summary>Flushes everything (to the disk for a regular file); a failure here is the command's failure.</summary>
    internal void FlushForCommit()
    {
        if (Committed && Mode == OutputWriteMode.Recording)
        {
            FlushToDisk();
            return;
        }

        Stream.Flush();
        try
        {
            if (IsRegularFile)
            {
                _file!.Flush(flushToDisk: true);
            }
            else
            {
                _file?.Flush();
            }
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw WriteFailure(e);
        }
    }

    /// <summary>Closes the file and, for a regular file, moves the temporary file into place.</summary>
    internal void MoveIntoPlace()
    {
        try
        {
            _file?.Dispose();
            _standardOutput?.Flush();
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            throw WriteFailure(e);
        }

        if (_temporaryPath != null)
        {
            try
            {
                File.Move(_temporaryPath, TargetPath, overwrite: true);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                throw WriteFailure(e);
            }

            _temporaryPath = null;
            NativeFileStatus.TrySyncFolder(System.IO.Path.GetDirectoryName(TargetPath)!);
        }

        Committed = true;
    }

    /// <summary>After a failure: closes the stream and deletes the temporary file only (a recording keeps what it has).</summary>
    internal void Abort()
    {
        try
        {
            _file?.Dispose();
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException)
        {
            // Buffered bytes could not be written (a full disk): they belong to a file being abandoned or a device.
        }

        _file = null;
        if (_temporaryPath != null)
        {
            try
            {
                File.Delete(_temporaryPath);
            }
            catch (Exception e) when (e is IOException or UnauthorizedAccessException)
            {
                // Left behind: a hidden .tmp beside the target, harmless.
            }

            _temporaryPath = null;
        }
    }
}
