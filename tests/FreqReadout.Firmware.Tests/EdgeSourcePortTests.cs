using FreqReadout.Firmware.Ports;
using Moq;

namespace FreqReadout.Firmware.Tests;

public class EdgeSourcePortTests
{
    [Fact]
    public void Moq_builds_a_fake_edge_source()
    {
        ulong tick = 42;
        var source = new Mock<IEdgeSource>(MockBehavior.Strict);
        source.Setup(s => s.TryReadEdge(out tick)).Returns(true);
        Assert.True(source.Object.TryReadEdge(out ulong got));
        Assert.Equal(42UL, got);
    }
}
