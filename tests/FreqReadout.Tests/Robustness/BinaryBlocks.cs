using System.Buffers.Binary;
using System.IO.Hashing;
using FreqReadout.Host.Captures;

namespace FreqReadout.Tests.Robustness;

/// <summary>
/// Block-aware mutation of binary captures: a byte-level mutant almost always fails its block's CRC-32
/// and never reaches the decoders behind it, so here the operator mutates one block's payload and the
/// block is framed again with a correct length and CRC (hardware-notes/binary-capture-format.md).
/// </summary>
public static class BinaryBlocks
{
    private const int PrefixLength = 9; // magic (8) + version (1)

    /// <summary>Splits a well-framed capture into its prefix and (tag, payload) blocks; false when the framing is broken.</summary>
    public static bool TrySplit(byte[] file, out List<(byte Tag, byte[] Payload)> blocks)
    {
        blocks = new List<(byte Tag, byte[] Payload)>();
        if (file.Length < PrefixLength)
        {
            return false;
        }

        int pos = PrefixLength;
        while (pos < file.Length)
        {
            byte tag = file[pos++];
            if (!BinaryCaptureFormat.TryReadUVarint(file, ref pos, out ulong length) || file.Length - pos < 4 || length > (ulong)(file.Length - pos - 4))
            {
                return false;
            }

            blocks.Add((tag, file.AsSpan(pos, (int)length).ToArray()));
            pos += (int)length + 4;
        }

        return true;
    }

    /// <summary>The capture with the given prefix and blocks, each framed with its length and CRC-32.</summary>
    public static byte[] Join(byte[] prefixSource, IEnumerable<(byte Tag, byte[] Payload)> blocks)
    {
        var output = new MemoryStream();
        output.Write(prefixSource, 0, PrefixLength);
        foreach (var (tag, payload) in blocks)
        {
            var head = new MemoryStream();
            head.WriteByte(tag);
            BinaryCaptureFormat.WriteUVarint(head, (ulong)payload.Length);
            var crc = new Crc32();
            crc.Append(head.ToArray());
            crc.Append(payload);
            Span<byte> stored = stackalloc byte[4];
            BinaryPrimitives.WriteUInt32LittleEndian(stored, crc.GetCurrentHashAsUInt32());
            output.Write(head.ToArray());
            output.Write(payload);
            output.Write(stored);
        }

        return output.ToArray();
    }

    /// <summary>
    /// Applies <paramref name="op"/> to the payload of one block of <paramref name="input"/> (a splice takes
    /// its tail from a block of <paramref name="other"/>) and frames the result again; null when the input's
    /// framing is already broken.
    /// </summary>
    public static byte[]? MutateBlock(MutationOperator op, byte[] input, byte[] other, Random rng)
    {
        if (!TrySplit(input, out var blocks) || blocks.Count == 0)
        {
            return null;
        }

        int at = rng.Next(blocks.Count);
        byte[] partner = TrySplit(other, out var otherBlocks) && otherBlocks.Count > 0 ? otherBlocks[rng.Next(otherBlocks.Count)].Payload : other;
        blocks[at] = (blocks[at].Tag, Mutator.Apply(op, blocks[at].Payload, partner, rng));
        if (op == MutationOperator.ChunkDuplication && rng.Next(4) == 0)
        {
            // Whole blocks repeated too (a data block twice, a second header or end block).
            blocks.Insert(rng.Next(blocks.Count + 1), blocks[rng.Next(blocks.Count)]);
        }

        return Join(input, blocks);
    }
}
