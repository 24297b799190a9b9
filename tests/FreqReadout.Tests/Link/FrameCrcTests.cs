using System.IO.Hashing;
using System.Text;
using FreqReadout.Link;
using FsCheck;
using FsCheck.Fluent;
using FsCheck.Xunit;

namespace FreqReadout.Tests.Link;

/// <summary>
/// The link's CRC-32 against its catalogue entry: G. Cook, "Catalogue of parametrised CRC algorithms" (reveng),
/// CRC-32/ISO-HDLC: width 32, poly 0x04C11DB7, init 0xFFFFFFFF, refin/refout true, xorout 0xFFFFFFFF, check 0xCBF43926
/// for the ASCII bytes "123456789" (exact, no tolerance); and against a general-purpose reference library,
/// System.IO.Hashing.Crc32 (.NET, the same CRC-32 of IEEE 802.3), on random inputs.
/// </summary>
public class FrameCrcTests
{
    [Fact]
    public void The_catalogue_check_value_is_0xCBF43926()
    {
        byte[] check = Encoding.ASCII.GetBytes("123456789");
        Assert.Equal(0xCBF43926u, FrameCrc.Compute(check, 0, check.Length));
    }

    [Fact]
    public void No_bytes_give_0_and_an_offset_is_honoured()
    {
        Assert.Equal(0u, FrameCrc.Compute(new byte[3], 1, 0));
        byte[] padded = Encoding.ASCII.GetBytes("xx123456789y");
        Assert.Equal(0xCBF43926u, FrameCrc.Compute(padded, 2, 9));
    }

    // Equal to System.IO.Hashing's CRC-32 on every input; a CRC continued over pieces equals the CRC of the whole; one
    // flipped bit always changes it (a CRC with more than one term detects every single-bit error).
    [Property(MaxTest = 300)]
    public Property Equals_the_reference_library_continues_over_pieces_and_catches_a_flipped_bit() =>
        Prop.ForAll(
            Gen.Choose(1, 300).SelectMany(n => Gen.ArrayOf(Gen.Choose(0, 255).Select(b => (byte)b), n)).ToArbitrary(),
            Gen.Choose(0, 1_000_000).ToArbitrary(),
            (data, pick) =>
            {
                int cut = pick % (data.Length + 1);
                uint whole = FrameCrc.Compute(data, 0, data.Length);
                uint pieces = FrameCrc.Continue(FrameCrc.Compute(data, 0, cut), data, cut, data.Length - cut);
                byte[] flipped = (byte[])data.Clone();
                int bit = pick % (8 * data.Length);
                flipped[bit / 8] ^= (byte)(1 << (bit % 8));
                return whole == Crc32.HashToUInt32(data) && whole == pieces && FrameCrc.Compute(flipped, 0, flipped.Length) != whole;
            });
}
