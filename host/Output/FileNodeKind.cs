namespace FreqReadout.Host.Output;

/// <summary>What a path names on the file system, after following symbolic links.</summary>
public enum FileNodeKind
{
    /// <summary>The platform could not tell (no identity API, or the query failed for another reason than a missing file).</summary>
    Unknown,

    /// <summary>Nothing exists at the path.</summary>
    Missing,

    /// <summary>A regular file.</summary>
    Regular,

    /// <summary>A folder.</summary>
    Directory,

    /// <summary>A character device such as /dev/null, /dev/full or a terminal (Windows: NUL, CON).</summary>
    CharacterDevice,

    /// <summary>A block device (a disk or partition).</summary>
    BlockDevice,

    /// <summary>A named pipe (FIFO).</summary>
    Pipe,

    /// <summary>A Unix domain socket.</summary>
    Socket,
}
