using System.Buffers.Binary;
using System.Globalization;
using System.IO.Hashing;

namespace FreqReadout.Host.Captures;

/// <summary>
/// Looks at a damaged capture file past the point where its reader stopped, to tell the user what a
/// salvage could not keep: for text, the data lines from the damaged line to the end and whether the
/// last line was cut (no line end, as a power loss leaves it); for binary, the damaged block's offset,
/// how much of it is there, its row count, and the blocks after it that still look intact (an intact
/// end block gives the exact number of rows lost). Reads the file once, block by block or 64 KiB at a time.
/// </summary>
public static class CaptureDamageSurvey
{
    /// <summary>The end of a text capture: its last line number and whether that line ends with a line break.</summary>
    /// <param name="path">The capture file.</param>
    /// <param name="fromLine">Count the data lines (not blank, not starting with '#') from this line on; long.MaxValue for none.</param>
    /// <param name="lastLine">Number of the last non-empty line (lines end at LF, CR or CR LF, as the reader counts them).</param>
    /// <param name="terminated">False when the file's last byte is not a line break: the last line may be cut.</param>
    /// <param name="dataLines">Data lines from <paramref name="fromLine"/> to the end.</param>
    public static void ScanText(string path, long fromLine, out long lastLine, out bool terminated, out long dataLines)
    {
        lastLine = 0;
        terminated = true;
        dataLines = 0;
        long line = 0;
        bool inLine = false;
        bool seenText = false;
        byte first = 0;
        bool afterCr = false;
        byte[] buffer = new byte[65536];
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite, 1, FileOptions.SequentialScan);
        int n;
        while ((n = stream.Read(buffer, 0, buffer.Length)) > 0)
        {
            for (int i = 0; i < n; i++)
            {
                byte b = buffer[i];
                if (b == (byte)'\n' && afterCr)
                {
                    afterCr = false;
                    continue; // the LF of a CR LF pair
                }

                afterCr = b == (byte)'\r';
                if (b == (byte)'\n' || b == (byte)'\r')
                {
                    if (!inLine)
                    {
                        line++; // an empty line
                    }

                    EndLine(line, fromLine, seenText, first, ref dataLines);
                    inLine = false;
                    seenText = false;
                    terminated = true;
                    continue;
                }

                if (!inLine)
                {
                    inLine = true;
                    line++;
                }

                terminated = false;
                if (!seenText && b != (byte)' ' && b != (byte)'\t')
                {
                    seenText = true;
                    first = b;
                    lastLine = line;
                }
                else if (seenText)
                {
                    lastLine = line;
                }
            }
        }

        if (inLine)
        {
            EndLine(line, fromLine, seenText, first, ref dataLines);
        }
    }

    /// <summary>What follows the damage of a binary capture that stopped at <paramref name="block"/> after <paramref name="rowsKept"/> rows.</summary>
    public static CaptureDamageReport Binary(string path, long block, long rowsKept)
    {
        using var stream = new FileStream(path, FileMode.Open, FileAccess.Read, FileShare.ReadWrite, 65536, FileOptions.SequentialScan);
        long fileLength = stream.Length;
        long offset = BinaryCaptureFormat.Magic.Length + 1;
        stream.Position = offset;
        for (long b = 0; b < block; b++)
        {
            if (!TryReadBlock(stream, out _, out long size, out _, out _, out _))
            {
                return new CaptureDamageReport($"block {block}", "the blocks before it could not be walked again", -1);
            }

            offset += size;
        }

        string where = $"block {block} (byte {offset.ToString(CultureInfo.InvariantCulture)})";
        if (offset >= fileLength)
        {
            return new CaptureDamageReport(where, "no rows: the file ends there, without the end block (its writer did not complete; only the trailer is missing)", 0);
        }

        stream.Position = offset;
        bool whole = TryReadBlock(stream, out byte tag, out long blockBytes, out bool crcOk, out long rowCount, out long endTotal);
        long present = fileLength - offset;
        string rows = rowCount >= 0 ? $"{Count(rowCount, "row")} by its row count" : "its rows";
        if (!whole)
        {
            string cut = blockBytes > 0
                ? $"cut after {present.ToString(CultureInfo.InvariantCulture)} of its {blockBytes.ToString(CultureInfo.InvariantCulture)} bytes"
                : $"cut inside its length ({present.ToString(CultureInfo.InvariantCulture)} bytes left)";
            if (tag == BinaryCaptureFormat.EndTag)
            {
                return new CaptureDamageReport(where, $"only the end block ({cut}): every row is kept, the trailer is lost", 0);
            }

            return new CaptureDamageReport(where, $"block {block} ({rows}), {cut}; nothing follows it", tag == BinaryCaptureFormat.DataTag && rowCount >= 0 ? rowCount : -1);
        }

        if (tag == BinaryCaptureFormat.EndTag && crcOk)
        {
            return new CaptureDamageReport(where, $"only the end block is damaged (it says {Count(endTotal, "row")}); every row before it is kept", Math.Max(0, endTotal - rowsKept));
        }

        // A whole block is there but bad (CRC or contents): walk on to see what the file still holds.
        long blocksAfter = 0;
        long rowsAfter = 0;
        long total = -1;
        string tail = "the file ends after them";
        while (stream.Position < fileLength)
        {
            if (!TryReadBlock(stream, out byte nextTag, out _, out bool ok, out long nextRows, out long nextTotal) || !ok)
            {
                tail = "then unreadable bytes";
                break;
            }

            if (nextTag == BinaryCaptureFormat.EndTag)
            {
                total = nextTotal;
                tail = "then the end block";
                break;
            }

            blocksAfter++;
            rowsAfter += Math.Max(0, nextRows);
        }

        string damaged = crcOk ? "malformed though its CRC-32 matches" : "corrupt (CRC-32 mismatch)";
        string lost = $"block {block} ({rows}, {damaged})" + (blocksAfter > 0
            ? $" and the {Count(blocksAfter, "intact-looking block")} after it ({Count(rowsAfter, "row")}; {tail}): a salvage keeps only the rows before the damage"
            : $"; {tail}");
        long rowsLost = total >= 0 ? Math.Max(0, total - rowsKept) : -1;
        if (rowsLost >= 0)
        {
            lost += $"; by the end block's total, {Count(rowsLost, "row")} in all";
        }

        return new CaptureDamageReport(where, lost, rowsLost);
    }

    /// <summary>"1 row", "3 rows".</summary>
    public static string Count(long n, string noun) => n.ToString(CultureInfo.InvariantCulture) + " " + noun + (n == 1 ? string.Empty : "s");

    private static void EndLine(long line, long fromLine, bool seenText, byte first, ref long dataLines)
    {
        if (line >= fromLine && seenText && first != (byte)'#')
        {
            dataLines++;
        }
    }

    /// <summary>
    /// Reads one block at the stream's position: its tag, its whole size (tag, length, payload, CRC;
    /// 0 when the length itself is cut), whether its CRC-32 matches, a data block's row count and an
    /// end block's row total (-1 when unknown). False when the file ends inside the block.
    /// </summary>
    private static bool TryReadBlock(Stream stream, out byte tag, out long size, out bool crcOk, out long rowCount, out long endTotal)
    {
        size = 0;
        crcOk = false;
        rowCount = -1;
        endTotal = -1;
        int t = stream.ReadByte();
        tag = (byte)Math.Max(0, t);
        if (t < 0)
        {
            return false;
        }

        Span<byte> head = stackalloc byte[11];
        head[0] = tag;
        int headLength = 1;
        ulong payload = 0;
        for (int shift = 0; ; shift += 7)
        {
            int b = stream.ReadByte();
            if (b < 0 || headLength >= head.Length)
            {
                return false;
            }

            head[headLength++] = (byte)b;
            payload |= (ulong)(b & 0x7F) << shift;
            if ((b & 0x80) == 0)
            {
                break;
            }
        }

        if (payload > BinaryCaptureFormat.MaxPayloadBytes)
        {
            return false;
        }

        size = headLength + (long)payload + 4;
        byte[] body = new byte[(int)payload + 4];
        int got = 0;
        while (got < body.Length)
        {
            int r = stream.Read(body, got, body.Length - got);
            if (r == 0)
            {
                break;
            }

            got += r;
        }

        int pos = 0;
        if (tag == BinaryCaptureFormat.DataTag && BinaryCaptureFormat.TryReadUVarint(body.AsSpan(0, Math.Min(got, (int)payload)), ref pos, out ulong rows))
        {
            rowCount = (long)Math.Min(rows, long.MaxValue);
        }

        if (got < body.Length)
        {
            return false;
        }

        var crc = new Crc32();
        crc.Append(head.Slice(0, headLength));
        crc.Append(body.AsSpan(0, (int)payload));
        crcOk = crc.GetCurrentHashAsUInt32() == BinaryPrimitives.ReadUInt32LittleEndian(body.AsSpan((int)payload, 4));
        pos = 0;
        if (tag == BinaryCaptureFormat.EndTag && crcOk && BinaryCaptureFormat.TryReadUVarint(body.AsSpan(0, (int)payload), ref pos, out ulong total))
        {
            endTotal = (long)Math.Min(total, long.MaxValue);
        }

        return true;
    }
}
