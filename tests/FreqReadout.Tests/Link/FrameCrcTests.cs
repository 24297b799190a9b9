using System.Text;
using FreqReadout.Link;
using FsCheck;
using FsCheck.Fluent;
using FsCheck.Xunit;

namespace FreqReadout.Tests.Link;

/// <summary>
/// CRC-16/CCITT-FALSE against its catalogue entry: G. Cook, "Catalogue of parametrised CRC algorithms" (reveng),
/// CRC-16/IBM-3740 (alias CRC-16/CCITT-FALSE): width 16, poly 0x1021, init 0xFFFF, refin/refout false, xorout 0,
/// check 0x29B1 for the ASCII bytes "123456789". Exact, no tolerance.
/// </summary>
public class FrameCrcTests
{
    [Fact]
    public void The_catalogue_check_value_is_0x29B1()
    {
        byte[] check = Encoding.ASCII.GetBytes("123456789");
        Assert.Equal(0x29B1, FrameCrc.Compute(check, 0, check.Length));
    }

    [Fact]
    public void No_bytes_give_the_initial_value_and_an_offset_is_honoured()
    {
        Assert.Equal(0xFFFF, FrameCrc.Compute(new byte[3], 1, 0));
        byte[] padded = Encoding.ASCII.GetBytes("xx123456789y");
        Assert.Equal(0x29B1, FrameCrc.Compute(padded, 2, 9));
    }

    // A CRC continued over pieces equals the CRC of the whole, and one flipped bit always changes it (a CRC of width 16
    // detects every single-bit error).
    [Property(MaxTest = 300)]
    public Property Pieces_give_the_whole_and_a_flipped_bit_is_caught() =>
        Prop.ForAll(
            Gen.Choose(1, 300).SelectMany(n => Gen.ArrayOf(Gen.Choose(0, 255).Select(b => (byte)b), n)).ToArbitrary(),
            Gen.Choose(0, 1_000_000).ToArbitrary(),
            (data, pick) =>
            {
                int cut = pick % (data.Length + 1);
                int whole = FrameCrc.Compute(data, 0, data.Length);
                int pieces = FrameCrc.Continue(FrameCrc.Compute(data, 0, cut), data, cut, data.Length - cut);
                byte[] flipped = (byte[])data.Clone();
                int bit = pick % (8 * data.Length);
                flipped[bit / 8] ^= (byte)(1 << (bit % 8));
                return whole == pieces && FrameCrc.Compute(flipped, 0, flipped.Length) != whole;
            });

    // The byte-at-a-time form equals the textbook bitwise definition (shift left, XOR the polynomial when the top bit
    // falls out; R. N. Williams, "A Painless Guide to CRC Error Detection Algorithms", 1993, section 8) on every input.
    [Property(MaxTest = 500)]
    public Property The_byte_wise_form_equals_the_bitwise_definition() =>
        Prop.ForAll(
            Gen.Choose(0, 300).SelectMany(n => Gen.ArrayOf(Gen.Choose(0, 255).Select(b => (byte)b), n)).ToArbitrary(),
            data => FrameCrc.Compute(data, 0, data.Length) == Bitwise(data));

    private static int Bitwise(byte[] data)
    {
        int crc = FrameCrc.InitialValue;
        foreach (byte b in data)
        {
            crc ^= b << 8;
            for (int bit = 0; bit < 8; bit++)
            {
                crc = (crc & 0x8000) != 0 ? (crc << 1) ^ FrameCrc.Polynomial : crc << 1;
            }

            crc &= 0xFFFF;
        }

        return crc;
    }
}
