namespace Mosaic.Imaging.Tests.Pyramids;

/// <summary>Records progress reports synchronously, in order (Progress&lt;T&gt; would post them to the thread pool), and can cancel a build at a chosen point.</summary>
internal sealed class ProgressLog(CancellationTokenSource? cancelAbove = null, double threshold = 0) : IProgress<double>
{
    private readonly List<double> _values = [];

    public IReadOnlyList<double> Values
    {
        get { lock (_values) return _values.ToArray(); }
    }

    public void Report(double value)
    {
        lock (_values) _values.Add(value);
        if (cancelAbove is not null && value > threshold) cancelAbove.Cancel();
    }
}
