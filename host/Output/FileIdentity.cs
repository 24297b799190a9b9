namespace FreqReadout.Host.Output;

/// <summary>
/// Which file a path names, after following symbolic links: the device and inode numbers on Linux and
/// macOS (<c>statx</c> / <c>stat</c>), the volume serial number and file index on Windows
/// (<c>GetFileInformationByHandle</c>). Two paths with the same identity are the same file, whether
/// they are the same path, a symbolic link to it or a hard link.
/// </summary>
public readonly struct FileIdentity
{
    private FileIdentity(FileNodeKind kind, ulong device, ulong index, int permissionBits)
    {
        Kind = kind;
        Device = device;
        Index = index;
        PermissionBits = permissionBits;
    }

    /// <summary>What the path names; <see cref="FileNodeKind.Missing"/> when nothing is there.</summary>
    public FileNodeKind Kind { get; }

    /// <summary>The device (Unix) or volume serial number (Windows) holding the file.</summary>
    public ulong Device { get; }

    /// <summary>The inode number (Unix) or file index (Windows) on that device.</summary>
    public ulong Index { get; }

    /// <summary>The Unix permission bits (mode &amp; 07777); 0 on Windows or when unknown.</summary>
    public int PermissionBits { get; }

    /// <summary>True when the identity was read (the file exists and the platform can tell).</summary>
    public bool IsKnown => Kind is not (FileNodeKind.Unknown or FileNodeKind.Missing);

    /// <summary>True when both identities are known and name the same file.</summary>
    public bool SameFileAs(FileIdentity other) => IsKnown && other.IsKnown && Device == other.Device && Index == other.Index;

    /// <summary>
    /// The identity of the file <paramref name="path"/> names, following symbolic links; kind
    /// <see cref="FileNodeKind.Missing"/> when nothing is there (or a folder on the way is missing),
    /// <see cref="FileNodeKind.Unknown"/> when the platform cannot tell.
    /// </summary>
    public static FileIdentity Of(string path)
    {
        if (!NativeFileStatus.TryQuery(path, out FileNodeKind kind, out ulong device, out ulong index, out int mode))
        {
            return new FileIdentity(FileNodeKind.Unknown, 0, 0, 0);
        }

        return new FileIdentity(kind, device, index, mode);
    }

    /// <inheritdoc/>
    public override string ToString() => IsKnown ? $"{Kind} {Device}:{Index}" : Kind.ToString();
}
