using FreqReadout.Link;
using FsCheck;
using FsCheck.Fluent;
using FsCheck.Xunit;

namespace FreqReadout.Tests.Link;

/// <summary>
/// COBS as defined by S. Cheshire and M. Baker, "Consistent Overhead Byte Stuffing", IEEE/ACM Transactions on
/// Networking 7(2), 1999 (blocks of up to 254 non-zero bytes, each led by its length + 1). The examples are the encoding
/// table of the Wikipedia article "Consistent Overhead Byte Stuffing", from memory; the worked example DE AD 00 BE EF is
/// from a note on COBS at iceworks.cc (2023). Exact bytes, no tolerance.
/// </summary>
public class ByteStuffingTests
{
    public static IEnumerable<object[]> Examples()
    {
        yield return new object[] { "00", "01 01" };
        yield return new object[] { "00 00", "01 01 01" };
        yield return new object[] { "11 22 00 33", "03 11 22 02 33" };
        yield return new object[] { "11 22 33 44", "05 11 22 33 44" };
        yield return new object[] { "11 00 00 00", "02 11 01 01 01" };
        yield return new object[] { "DE AD 00 BE EF", "03 DE AD 03 BE EF" };
        yield return new object[] { "", "01" };
    }

    [Theory]
    [MemberData(nameof(Examples))]
    public void Published_examples_encode_and_decode_exactly(string data, string encoded)
    {
        byte[] source = Hex(data);
        byte[] expected = Hex(encoded);
        var buffer = new byte[ByteStuffing.MaxEncodedLength(source.Length) + 2];
        int n = ByteStuffing.Encode(source, 0, source.Length, buffer, 1);
        Assert.Equal(expected, buffer.Skip(1).Take(n).ToArray());

        var back = new byte[source.Length + 1];
        Assert.True(ByteStuffing.TryDecode(buffer, 1, n, back, 0, out int written));
        Assert.Equal(source, back.Take(written).ToArray());
    }

    // The long examples of the same table: 254 non-zero bytes need no second block; a 255th does.
    [Fact]
    public void Full_blocks_of_254_bytes_encode_as_the_table_says()
    {
        byte[] ones = Enumerable.Range(1, 254).Select(i => (byte)i).ToArray();     // 01 .. FE
        Assert.Equal(new byte[] { 0xFF }.Concat(ones), EncodeAll(ones));

        byte[] leadingZero = new byte[] { 0 }.Concat(ones).ToArray();               // 00 01 .. FE
        Assert.Equal(new byte[] { 0x01, 0xFF }.Concat(ones), EncodeAll(leadingZero));

        byte[] to255 = Enumerable.Range(1, 255).Select(i => (byte)i).ToArray();    // 01 .. FF
        Assert.Equal(new byte[] { 0xFF }.Concat(ones).Concat(new byte[] { 0x02, 0xFF }), EncodeAll(to255));
    }

    [Theory]
    [InlineData("03 11 00 33")]   // a zero inside the encoding
    [InlineData("05 11 22")]      // a code that runs past the end
    [InlineData("00")]
    [InlineData("")]
    public void What_cannot_be_an_encoding_is_refused(string encoded)
    {
        byte[] source = Hex(encoded);
        Assert.False(ByteStuffing.TryDecode(source, 0, source.Length, new byte[16], 0, out _));
    }

    // Any data round-trips, the encoding holds no zero byte, and it is no longer than MaxEncodedLength.
    [Property(MaxTest = 300)]
    public Property Any_data_round_trips_without_a_zero_byte() =>
        Prop.ForAll(
            Gen.Choose(0, 700).SelectMany(n => Gen.ArrayOf(Gen.Frequency((3, Gen.Constant((byte)0)), (7, Gen.Choose(1, 255).Select(b => (byte)b))), n)).ToArbitrary(),
            data =>
            {
                var encoded = new byte[ByteStuffing.MaxEncodedLength(data.Length)];
                int n = ByteStuffing.Encode(data, 0, data.Length, encoded, 0);
                var back = new byte[data.Length + 1];
                bool ok = ByteStuffing.TryDecode(encoded, 0, n, back, 0, out int written);
                return ok && n <= encoded.Length && encoded.Take(n).All(b => b != 0) && back.Take(written).SequenceEqual(data) && written == data.Length;
            });

    private static byte[] EncodeAll(byte[] data)
    {
        var buffer = new byte[ByteStuffing.MaxEncodedLength(data.Length)];
        int n = ByteStuffing.Encode(data, 0, data.Length, buffer, 0);
        return buffer.Take(n).ToArray();
    }

    private static byte[] Hex(string text) =>
        text.Split(' ', StringSplitOptions.RemoveEmptyEntries).Select(h => Convert.ToByte(h, 16)).ToArray();
}
