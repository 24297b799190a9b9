namespace FreqReadout.Host.Output;

/// <summary>
/// The files one command writes, handled as one unit. Before any work, <see cref="TryPrepare"/> checks
/// every output — its folder exists, it is not a folder or a disk, it is not one of the command's
/// inputs or another of its outputs (by file identity: the same path, a symbolic link or a hard link;
/// for a file that does not exist yet, by its resolved folder and name) — and opens them all (a
/// temporary file beside each regular target), so an unwritable path fails before a long run.
/// <see cref="Commit"/> flushes every output to the disk and only then moves each into place;
/// disposing the set without a commit deletes the temporary files and touches nothing else.
/// </summary>
/// <example>
/// <code>
/// using var outputs = new OutputFileSet();
/// outputs.AddInput("the capture", capturePath);
/// OutputFile readings = outputs.AddOutput("--readings", readingsPath, "the readings");
/// if (!outputs.TryPrepare(out OutputFileException? problem)) return Fail(problem!.Message, problem.ExitCode);
/// ... write readings.Stream ...
/// outputs.Commit();
/// </code>
/// </example>
public sealed class OutputFileSet : IDisposable
{
    private readonly List<NamedInput> _inputs = new();
    private readonly List<OutputFile> _outputs = new();
    private bool _prepared;
    private bool _committed;

    /// <summary>
    /// True when the command prints its own report on standard output, so an output named <c>-</c>
    /// would mix with it and is refused.
    /// </summary>
    public bool StandardOutputInUse { get; set; }

    /// <summary>The outputs in the order they were added.</summary>
    public IReadOnlyList<OutputFile> Outputs => _outputs;

    /// <summary>Declares a file the command reads (an output may not be it). A null path is ignored.</summary>
    /// <param name="label">How messages name it, e.g. "the capture" or "the scene file (--scene)".</param>
    public void AddInput(string label, string? path)
    {
        if (path != null)
        {
            _inputs.Add(new NamedInput(label, path));
        }
    }

    /// <summary>Declares a file the command writes.</summary>
    /// <param name="label">How the command line names it, e.g. "--readings" or "&lt;out&gt;".</param>
    /// <param name="path">The path as given; <c>-</c> is standard output.</param>
    /// <param name="what">What it holds, for messages: "the readings".</param>
    /// <param name="mode">Replace on success (default) or a recording written in place.</param>
    public OutputFile AddOutput(string label, string path, string what, OutputWriteMode mode = OutputWriteMode.ReplaceOnSuccess)
    {
        if (_prepared)
        {
            throw new InvalidOperationException("outputs are declared before the set is prepared");
        }

        var file = new OutputFile(label, path, what, mode);
        _outputs.Add(file);
        return file;
    }

    /// <summary>
    /// Checks every output against the file system, the inputs and each other, then opens them all.
    /// On failure nothing is left behind and <paramref name="problem"/> holds the one-line message and
    /// the exit code (2 for a clash with an input or another output, 1 for what the file system refuses).
    /// </summary>
    public bool TryPrepare(out OutputFileException? problem)
    {
        problem = null;
        try
        {
            Prepare();
            return true;
        }
        catch (OutputFileException e)
        {
            AbortAll();
            problem = e;
            return false;
        }
    }

    /// <summary>Flushes every output to the disk, then moves each regular file into place. Throws <see cref="OutputFileException"/> (the set then aborts on dispose).</summary>
    public void Commit()
    {
        if (!_prepared)
        {
            throw new InvalidOperationException("the output set is not prepared");
        }

        foreach (OutputFile file in _outputs)
        {
            file.FlushForCommit();
        }

        foreach (OutputFile file in _outputs)
        {
            file.MoveIntoPlace();
        }

        _committed = true;
    }

    /// <summary>Without a commit: closes every output and deletes the temporary files (a recording keeps its partial file).</summary>
    public void Dispose()
    {
        if (!_committed)
        {
            AbortAll();
        }
    }

    /// <summary>The note for an error line after a failure: what became of each output ("x.csv is unchanged; y.json was not created").</summary>
    public string UnchangedNote()
    {
        return string.Join("; ", _outputs.Select(o => o.UnchangedNote).Where(n => n.Length > 0));
    }

    private void AbortAll()
    {
        foreach (OutputFile file in _outputs)
        {
            file.Abort();
        }
    }

    private void Prepare()
    {
        if (_prepared)
        {
            throw new InvalidOperationException("the output set is already prepared");
        }

        var outputKeys = new List<FileKey>();
        foreach (OutputFile file in _outputs)
        {
            outputKeys.Add(Resolve(file));
            if (file.RegularFileNeededBecause is string because && !file.IsRegularFile)
            {
                throw file.Refusal($"is {(file.TargetKind == OutputTargetKind.StandardOutput ? "standard output" : file.TargetKind == OutputTargetKind.Pipe ? "a pipe" : "a device")}, but a regular file is needed: {because}");
            }
        }

        var inputKeys = _inputs.Select(i => KeyOfInput(i.Path)).ToList();
        for (int o = 0; o < _outputs.Count; o++)
        {
            OutputFile output = _outputs[o];
            if (outputKeys[o].Shared)
            {
                continue;
            }

            for (int i = 0; i < _inputs.Count; i++)
            {
                if (outputKeys[o].Same(inputKeys[i]))
                {
                    string how = SamePathText(output.Path, _inputs[i].Path) ? string.Empty : " (the same file under another name or through a link)";
                    throw new OutputFileException(
                        $"{output.Label} {output.Path} is {_inputs[i].Label} {_inputs[i].Path}{how}: a command never writes over its own input; choose another file name",
                        OutputFileException.UsageExitCode);
                }
            }

            for (int p = 0; p < o; p++)
            {
                if (outputKeys[o].Same(outputKeys[p]))
                {
                    OutputFile other = _outputs[p];
                    if (output.TargetKind == OutputTargetKind.StandardOutput)
                    {
                        throw new OutputFileException(
                            $"{other.Label} {other.Path} and {output.Label} {output.Path} would both go to standard output: give one of them a file name",
                            OutputFileException.UsageExitCode);
                    }

                    string how = SamePathText(output.Path, other.Path) ? string.Empty : " (the same file under another name or through a link)";
                    throw new OutputFileException(
                        $"{other.Label} {other.Path} and {output.Label} {output.Path} are the same file{how}: each output needs a file of its own",
                        OutputFileException.UsageExitCode);
                }
            }
        }

        _prepared = true;
        foreach (OutputFile file in _outputs)
        {
            try
            {
                file.Open();
            }
            catch (Exception e) when (e is IOException and not OutputFileException || e is UnauthorizedAccessException)
            {
                throw file.WriteFailure(e);
            }
        }
    }

    /// <summary>Finds what the output path names (following links) and refuses what cannot be written.</summary>
    private FileKey Resolve(OutputFile file)
    {
        if (file.Path.Length == 0)
        {
            throw new OutputFileException($"{file.Label}: the path is empty; give a file name", OutputFileException.UsageExitCode);
        }

        int standardStream = StandardStreamOf(file.Path);
        if (standardStream == 2)
        {
            throw new OutputFileException(
                $"{file.Label} {file.Path}: standard error carries this command's messages; give a file name",
                OutputFileException.UsageExitCode);
        }

        if (standardStream == 1)
        {
            // "-" or a name of descriptor 1: written through the descriptor itself, so a shell's ">>" still appends
            // and nothing is replaced (reopening the path would start at offset 0, or replace a redirected file).
            file.TargetKind = OutputTargetKind.StandardOutput;
            if (StandardOutputInUse)
            {
                throw new OutputFileException(
                    $"{file.Label} {file.Path}: standard output already carries this command's report; give a file name",
                    OutputFileException.UsageExitCode);
            }

            return FileKey.StandardOutput;
        }

        string target;
        FileIdentity identity;
        FileNodeKind kind;
        try
        {
            // The identity follows every link (also /dev/stdout's links into /proc); the path of a link's final
            // target is needed only for a regular file (its temporary file goes beside it) or one to be created.
            string full = Path.GetFullPath(file.Path);
            identity = FileIdentity.Of(full);
            kind = identity.Kind != FileNodeKind.Unknown
                ? identity.Kind
                : Directory.Exists(full) ? FileNodeKind.Directory : File.Exists(full) ? FileNodeKind.Regular : FileNodeKind.Missing;
            target = full;
            if (kind is FileNodeKind.Regular or FileNodeKind.Missing)
            {
                string final = FollowLinks(full);
                target = kind == FileNodeKind.Missing || File.Exists(final) ? final : full;
            }
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            throw file.Refusal(Commands.FileErrorText.Reason(file.Path, e));
        }

        file.TargetPath = target;
        switch (kind)
        {
            case FileNodeKind.Directory:
                throw file.Refusal("is a directory, expected a file");
            case FileNodeKind.BlockDevice:
                throw file.Refusal("is a block device (a disk or partition); refusing to write onto it");
            case FileNodeKind.Socket:
                throw file.Refusal("is a socket, expected a file");
            case FileNodeKind.CharacterDevice:
                file.TargetKind = OutputTargetKind.Device;
                return FileKey.SharedDevice;
            case FileNodeKind.Pipe:
                file.TargetKind = OutputTargetKind.Pipe;
                return FileKey.Of(identity, target);
            case FileNodeKind.Regular:
                if (file.Mode == OutputWriteMode.Recording)
                {
                    throw file.Refusal("the file exists, and a recording never overwrites one; choose a new file name");
                }

                file.TargetKind = OutputTargetKind.ExistingFile;
                return FileKey.Of(identity, target);
            default:
                file.TargetKind = OutputTargetKind.NewFile;
                return KeyOfNewFile(file, target);
        }
    }

    /// <summary>A file that does not exist yet: its folder must exist; it is known by the folder's identity and its name.</summary>
    private static FileKey KeyOfNewFile(OutputFile file, string target)
    {
        string? folder = Path.GetDirectoryName(target);
        string name = Path.GetFileName(target);
        if (folder == null || name.Length == 0)
        {
            throw file.Refusal("expected a file name, found a folder or drive root");
        }

        FileIdentity folderIdentity = FileIdentity.Of(folder);
        FileNodeKind folderKind = folderIdentity.Kind != FileNodeKind.Unknown
            ? folderIdentity.Kind
            : Directory.Exists(folder) ? FileNodeKind.Directory : File.Exists(folder) ? FileNodeKind.Regular : FileNodeKind.Missing;
        if (folderKind == FileNodeKind.Missing)
        {
            throw file.Refusal("its folder does not exist");
        }

        if (folderKind != FileNodeKind.Directory)
        {
            throw file.Refusal($"{folder} is not a folder");
        }

        return FileKey.OfNewFile(folderIdentity, folder, name);
    }

    private static FileKey KeyOfInput(string path)
    {
        try
        {
            if (path.Length == 0 || StandardStreamOf(path) != 0)
            {
                return FileKey.None;
            }

            string full = Path.GetFullPath(path);
            FileIdentity identity = FileIdentity.Of(full);
            string target = full;
            if (identity.Kind == FileNodeKind.Missing || (identity.Kind == FileNodeKind.Unknown && !File.Exists(full)))
            {
                target = FollowLinks(full);
                string? folder = Path.GetDirectoryName(target);
                return folder == null ? FileKey.None : FileKey.OfNewFile(FileIdentity.Of(folder), folder, Path.GetFileName(target));
            }

            return FileKey.Of(identity, identity.IsKnown ? target : FollowLinks(full));
        }
        catch (Exception e) when (e is IOException or UnauthorizedAccessException or ArgumentException or NotSupportedException)
        {
            return FileKey.None; // the command reports the unreadable input itself
        }
    }

    /// <summary>1 for a name of standard output ("-", /dev/stdout, /dev/fd/1, /proc/self/fd/1), 2 for one of standard error, else 0.</summary>
    internal static int StandardStreamOf(string path)
    {
        if (path == OutputFile.StandardOutputPath)
        {
            return 1;
        }

        if (OperatingSystem.IsWindows())
        {
            return 0;
        }

        return path switch
        {
            "/dev/stdout" or "/dev/fd/1" or "/proc/self/fd/1" => 1,
            "/dev/stderr" or "/dev/fd/2" or "/proc/self/fd/2" => 2,
            _ => 0,
        };
    }

    /// <summary>The final target of a symbolic link (even one that points to nothing yet); the path itself when it is no link.</summary>
    private static string FollowLinks(string fullPath)
    {
        if (new FileInfo(fullPath).LinkTarget == null)
        {
            return fullPath;
        }

        return File.ResolveLinkTarget(fullPath, returnFinalTarget: true) is FileSystemInfo final ? final.FullName : fullPath;
    }

    private static bool SamePathText(string a, string b)
    {
        try
        {
            return string.Equals(Path.GetFullPath(a), Path.GetFullPath(b), FileKey.NameComparison);
        }
        catch (Exception e) when (e is ArgumentException or NotSupportedException or PathTooLongException)
        {
            return a == b;
        }
    }

    private sealed record NamedInput(string Label, string Path);

    /// <summary>How two paths are compared: by identity when known, else by resolved folder and name, else by resolved path.</summary>
    private sealed class FileKey
    {
        /// <summary>Names differing only in case are one file on Windows and (by default) macOS.</summary>
        public static readonly StringComparison NameComparison =
            OperatingSystem.IsWindows() || OperatingSystem.IsMacOS() ? StringComparison.OrdinalIgnoreCase : StringComparison.Ordinal;

        public static readonly FileKey None = new(null, null, null, null, shared: true);
        public static readonly FileKey SharedDevice = new(null, null, null, null, shared: true);
        public static readonly FileKey StandardOutput = new(null, null, null, "-", shared: false);

        private readonly FileIdentity? _identity;
        private readonly FileIdentity? _folder;
        private readonly string? _name;
        private readonly string? _path;

        private FileKey(FileIdentity? identity, FileIdentity? folder, string? name, string? path, bool shared)
        {
            _identity = identity;
            _folder = folder;
            _name = name;
            _path = path;
            Shared = shared;
        }

        /// <summary>A device such as /dev/null may be named by several outputs: nothing there is replaced.</summary>
        public bool Shared { get; }

        public static FileKey Of(FileIdentity identity, string fullPath) =>
            identity.IsKnown ? new FileKey(identity, null, null, null, false) : new FileKey(null, null, null, fullPath, false);

        public static FileKey OfNewFile(FileIdentity folder, string folderPath, string name) =>
            folder.IsKnown ? new FileKey(null, folder, name, null, false) : new FileKey(null, null, null, Path.Combine(folderPath, name), false);

        public bool Same(FileKey other)
        {
            if (Shared || other.Shared)
            {
                return false;
            }

            if (_identity is FileIdentity a && other._identity is FileIdentity b)
            {
                return a.SameFileAs(b);
            }

            if (_folder is FileIdentity f && other._folder is FileIdentity g)
            {
                return f.SameFileAs(g) && string.Equals(_name, other._name, NameComparison);
            }

            return _path != null && other._path != null && string.Equals(_path, other._path, NameComparison);
        }
    }
}
