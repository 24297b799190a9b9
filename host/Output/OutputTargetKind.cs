namespace FreqReadout.Host.Output;

/// <summary>What an output path turned out to be when the outputs were checked.</summary>
public enum OutputTargetKind
{
    /// <summary>Not checked yet.</summary>
    Unchecked,

    /// <summary>No file there yet: it is created (through a temporary file, unless recording).</summary>
    NewFile,

    /// <summary>An existing regular file: replaced only on success (a recording refuses it).</summary>
    ExistingFile,

    /// <summary>A character device (/dev/null, /dev/full, a terminal, NUL): written directly, never created, replaced or deleted.</summary>
    Device,

    /// <summary>A named pipe: written directly.</summary>
    Pipe,

    /// <summary><c>-</c>: standard output, written directly.</summary>
    StandardOutput,
}
