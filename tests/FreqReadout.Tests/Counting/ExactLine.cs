namespace FreqReadout.Tests.Counting;

/// <summary>
/// Least-squares slope of y on x computed exactly in 128-bit integers (an independent check of the
/// counters' residual sums): slope = (n Sum(xy) - Sum(x) Sum(y)) / (n Sum(x^2) - Sum(x)^2).
/// x and y are taken relative to the first point so the sums fit.
/// </summary>
internal sealed class ExactLine
{
    private Int128 _n, _sx, _sy, _sxx, _sxy;
    private long _x0, _y0;

    public void Clear() { _n = _sx = _sy = _sxx = _sxy = 0; }

    public void Add(long x, long y)
    {
        if (_n == 0) { _x0 = x; _y0 = y; }
        Int128 dx = x - _x0, dy = y - _y0;
        _n++; _sx += dx; _sy += dy; _sxx += dx * dx; _sxy += dx * dy;
    }

    public int Count => (int)_n;

    public double Slope
    {
        get
        {
            Int128 num = _n * _sxy - _sx * _sy;
            Int128 den = _n * _sxx - _sx * _sx;
            return (double)(num / den) + (double)(num % den) / (double)den;
        }
    }
}
