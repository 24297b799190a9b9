namespace FreqReadout.Tests.DeviceFit;

/// <summary>
/// A loop found from backward branches: the IL range [HeaderOffset, EndOffset) from a branch target to
/// the end of the last branch that jumps back to it. Index counts a method's loops in order of their
/// headers from 0; that index keys the loop's declared bound.
/// </summary>
internal sealed class IlLoop
{
    public IlLoop(int index, int headerOffset, int endOffset)
    {
        Index = index;
        HeaderOffset = headerOffset;
        EndOffset = endOffset;
    }

    public int Index { get; }

    public int HeaderOffset { get; }

    public int EndOffset { get; }

    public bool Contains(int offset) => offset >= HeaderOffset && offset < EndOffset;

    public bool Encloses(IlLoop other) => other != this && HeaderOffset <= other.HeaderOffset && other.EndOffset <= EndOffset;
}
