namespace Mosaic.Server.Sky;

/// <summary>
/// Follows a curve through a region of the image and returns polylines that stay within <see cref="Tolerance"/>
/// screen pixels of it: each chord is halved until its midpoint and quarter points lie that close, and no chord is
/// longer than <see cref="MaxChord"/> screen pixels (a smooth line needs some hundreds to a few thousand points of
/// the curve; a chord still unresolved after many halvings marks a jump, and the line is broken there). The curve is cut where it has no pixel or leaves the region;
/// the cut points are found by bisection, so every point returned lies on the curve itself.
/// </summary>
internal sealed class LineTracer(SkyCurve curve, ViewBox region)
{
    public const double Tolerance = 0.5;
    public const double MaxChord = 10;
    private const int InitialIntervals = 96;
    private const int MaxDepth = 24;
    private const int SearchDepth = 8;
    private const int BlindSearchDepth = 4;
    private const int BisectionSteps = 60;

    // A smooth line needs a few thousand evaluations; a pathological one (a distortion polynomial far outside its
    // image) must not run on: past this, chords are taken as they are.
    private const int EvaluationBudget = 20_000;
    private int _evaluations;

    private readonly List<List<TracePoint>> _segments = [];
    private List<TracePoint>? _current;

    private readonly record struct Sample(double T, double X, double Y, bool Valid, bool Inside)
    {
        public TracePoint Point => new(T, X, Y);
    }

    /// <summary>The pieces of the curve inside the region for parameters from <paramref name="t0"/> to <paramref name="t1"/>.</summary>
    public List<List<TracePoint>> Trace(double t0, double t1)
    {
        _segments.Clear();
        _current = null;
        _evaluations = 0;
        var previous = Eval(t0);
        if (previous.Inside) Start(previous);
        for (var i = 1; i <= InitialIntervals; i++)
        {
            var next = Eval(i == InitialIntervals ? t1 : t0 + (t1 - t0) * i / InitialIntervals);
            Interval(previous, next, 0);
            previous = next;
        }
        End();
        return [.. _segments];
    }

    /// <summary>
    /// Where a traced segment crosses the edge of <paramref name="box"/>, as points of the curve just inside it.
    /// </summary>
    public List<TracePoint> Crossings(IReadOnlyList<TracePoint> segment, ViewBox box)
    {
        var found = new List<TracePoint>();
        for (var k = 1; k < segment.Count; k++)
        {
            var a = segment[k - 1];
            var b = segment[k];
            bool inA = box.Contains(a.X, a.Y), inB = box.Contains(b.X, b.Y);
            if (inA == inB) continue;
            var (inside, outside) = inA ? (a.T, b.T) : (b.T, a.T);
            var best = inA ? a : b;
            for (var step = 0; step < BisectionSteps; step++)
            {
                var mid = (inside + outside) / 2;
                if (curve(mid, out var x, out var y) && box.Contains(x, y))
                {
                    inside = mid;
                    best = new TracePoint(mid, x, y);
                }
                else
                {
                    outside = mid;
                }
            }
            found.Add(best);
        }
        return found;
    }

    private bool Exhausted => _evaluations > EvaluationBudget;

    private Sample Eval(double t)
    {
        _evaluations++;
        var valid = curve(t, out var x, out var y) && double.IsFinite(x) && double.IsFinite(y);
        return new Sample(t, x, y, valid, valid && region.Contains(x, y));
    }

    private void Interval(Sample a, Sample b, int depth)
    {
        if (a.Inside && b.Inside)
        {
            Walk(a, Eval((a.T + b.T) / 2), b, depth);
        }
        else if (a.Inside)
        {
            var edge = Boundary(a, b);
            Walk(a, Eval((a.T + edge.T) / 2), edge, depth);
            End();
        }
        else if (b.Inside)
        {
            var edge = Boundary(b, a);
            Start(edge);
            Walk(edge, Eval((edge.T + b.T) / 2), b, depth);
        }
        else if (MightEnter(a, b, depth))
        {
            var m = Eval((a.T + b.T) / 2);
            Interval(a, m, depth + 1);
            Interval(m, b, depth + 1);
        }
    }

    /// <summary>From <paramref name="a"/> (already emitted) to <paramref name="b"/>, both inside, through <paramref name="m"/> at the middle parameter.</summary>
    private void Walk(Sample a, Sample m, Sample b, int depth)
    {
        if (!m.Inside)
        {
            Interval(a, m, depth + 1);
            Interval(m, b, depth + 1);
            return;
        }
        var q1 = Eval((a.T + m.T) / 2);
        var q3 = Eval((m.T + b.T) / 2);
        var chord = Chord(a, b);
        if (q1.Inside && q3.Inside && chord <= MaxChord
            && Deviation(a, b, m) <= Tolerance && Deviation(a, b, q1) <= Tolerance && Deviation(a, b, q3) <= Tolerance)
        {
            Emit(b);
            return;
        }
        if (depth >= MaxDepth || Exhausted)
        {
            // Still unresolved on a vanishing parameter step: the curve jumps here (a projection's seam).
            if (chord > MaxChord)
            {
                End();
                Start(b);
            }
            else
            {
                Emit(b);
            }
            return;
        }
        Walk(a, q1, m, depth + 1);
        Walk(m, q3, b, depth + 1);
    }

    /// <summary>The last point inside the region between an inside and an outside sample.</summary>
    private Sample Boundary(Sample inside, Sample outside)
    {
        for (var step = 0; step < BisectionSteps; step++)
        {
            var m = Eval((inside.T + outside.T) / 2);
            if (m.Inside) inside = m; else outside = m;
        }
        return inside;
    }

    /// <summary>Whether a piece between two outside samples may still dip into the region.</summary>
    private bool MightEnter(Sample a, Sample b, int depth)
    {
        if (Exhausted) return false;
        if (!a.Valid || !b.Valid) return depth < BlindSearchDepth;
        if (depth >= SearchDepth) return false;
        var reach = Math.Sqrt((a.X - b.X) * (a.X - b.X) + (a.Y - b.Y) * (a.Y - b.Y));
        return Math.Min(a.X, b.X) - reach <= region.X1 && Math.Max(a.X, b.X) + reach >= region.X0
            && Math.Min(a.Y, b.Y) - reach <= region.Y1 && Math.Max(a.Y, b.Y) + reach >= region.Y0;
    }

    private double Chord(Sample a, Sample b) => region.ScreenDistance(new PixelPoint(a.X, a.Y), new PixelPoint(b.X, b.Y));

    /// <summary>Screen distance from <paramref name="p"/> to the chord from <paramref name="a"/> to <paramref name="b"/>.</summary>
    private double Deviation(Sample a, Sample b, Sample p)
    {
        double ax = a.X * region.ScaleX, ay = a.Y * region.ScaleY;
        double bx = b.X * region.ScaleX - ax, by = b.Y * region.ScaleY - ay;
        double px = p.X * region.ScaleX - ax, py = p.Y * region.ScaleY - ay;
        var length2 = bx * bx + by * by;
        var f = length2 > 0 ? Math.Clamp((px * bx + py * by) / length2, 0, 1) : 0;
        double dx = px - f * bx, dy = py - f * by;
        return Math.Sqrt(dx * dx + dy * dy);
    }

    private void Start(Sample s)
    {
        End();
        _current = [s.Point];
    }

    private void Emit(Sample s)
    {
        if (_current is null)
        {
            _current = [s.Point];
            return;
        }
        var last = _current[^1];
        if (last.X != s.X || last.Y != s.Y) _current.Add(s.Point);
    }

    private void End()
    {
        if (_current is { Count: >= 2 }) _segments.Add(_current);
        _current = null;
    }
}
