namespace FreqReadout.Host.Import;

/// <summary>A variable declared in a value change dump (<c>$var type width id reference [range] $end</c>).</summary>
/// <param name="Id">The identifier code its value changes use.</param>
/// <param name="Width">Bits.</param>
/// <param name="FullName">Scopes and reference joined by dots, e.g. <c>top.probe.clk</c>.</param>
/// <param name="ShortName">The reference alone, e.g. <c>clk</c>.</param>
/// <param name="LowBit">The index of its least significant bit (from a <c>[msb:lsb]</c> range; 0 without one).</param>
/// <param name="HighBit">The index of its most significant bit.</param>
public sealed record VcdVariable(string Id, int Width, string FullName, string ShortName, int LowBit, int HighBit);
