using FreqReadout.Firmware.Device;

namespace FreqReadout.Firmware.Tests;

/// <summary>
/// Reads of an extended 16-bit pulse counter that raced its overflow interrupt (off by 32767 either way) are mended, a
/// step no span explains is dropped without moving the filter's state, and good reads pass unchanged (invented counts:
/// 100 kHz read every millisecond).
/// </summary>
public class WrapStraddleFilterTests
{
    private const long Span = 32767;

    [Fact]
    public void Good_reads_pass_unchanged()
    {
        var filter = new WrapStraddleFilter(Span);
        for (long k = 0; k < 1000; k++)
        {
            Assert.True(filter.TryAccept(5000 + (100 * k), out long count));
            Assert.Equal(5000 + (100 * k), count);
        }

        Assert.Equal(0, filter.Mended + filter.Dropped);
    }

    [Theory]
    [InlineData(-Span)]
    [InlineData(Span)]
    public void A_read_off_by_the_span_is_mended_and_the_next_reads_follow(long error)
    {
        var filter = new WrapStraddleFilter(Span);
        Assert.True(filter.TryAccept(40_000, out _));
        Assert.True(filter.TryAccept(40_100 + error, out long mended));
        Assert.Equal(40_100, mended);
        Assert.True(filter.TryAccept(40_200, out long next));
        Assert.Equal(40_200, next);
        Assert.Equal(1, filter.Mended);
        Assert.Equal(0, filter.Dropped);
    }

    [Fact]
    public void A_step_no_span_explains_is_dropped_and_the_state_stays()
    {
        var filter = new WrapStraddleFilter(Span);
        Assert.True(filter.TryAccept(40_000, out _));
        Assert.False(filter.TryAccept(40_000 + 20_000, out _));   // neither a count step nor a straddle
        Assert.True(filter.TryAccept(40_200, out long count));
        Assert.Equal(40_200, count);
        Assert.Equal(1, filter.Dropped);
        Assert.Equal(0, filter.Mended);
    }
}
