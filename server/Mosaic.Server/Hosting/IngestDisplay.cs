using System.Globalization;

namespace Mosaic.Server.Hosting;

/// <summary>
/// The ingest's terminal output: on a terminal one bar line rewritten in place, with finished pyramids printed
/// above it; into a file or pipe a plain line every <c>plainInterval</c>, so logs stay readable.
/// </summary>
internal sealed class IngestDisplay(TextWriter output, bool interactive, TimeSpan plainInterval)
{
    private const int BarWidth = 28;
    private TimeSpan? _lastPlain;
    private int _barLength;

    public void Update(IngestSnapshot snapshot)
    {
        var line = Format(snapshot);
        if (interactive)
        {
            // Pad over the longer line before; the cursor stays at its start, ready for the next.
            output.Write('\r' + line.PadRight(_barLength));
            _barLength = line.Length;
            output.Flush();
        }
        else if (_lastPlain is not { } last || snapshot.Elapsed - last >= plainInterval)
        {
            _lastPlain = snapshot.Elapsed;
            output.WriteLine(line);
        }
    }

    /// <summary>A line of its own (a pyramid finished or failed), above the bar on a terminal.</summary>
    public void Note(string line)
    {
        if (interactive && _barLength > 0)
        {
            output.Write('\r' + new string(' ', _barLength) + '\r');
            _barLength = 0;
        }
        output.WriteLine(line);
    }

    /// <summary>The last state of the bar, always printed, and the bar left behind on its own line.</summary>
    public void Finish(IngestSnapshot snapshot)
    {
        _lastPlain = null;
        Update(snapshot);
        if (interactive) output.WriteLine();
    }

    public static string Format(IngestSnapshot s)
    {
        var filled = (int)Math.Round(s.Fraction * BarWidth);
        var eta = s.Remaining is { } remaining ? Duration(remaining) : "--:--";
        var rate = s.Rate is { } r ? $"{Pixels(r)}/s" : "-";
        var line = string.Create(CultureInfo.InvariantCulture,
            $"{s.Fraction * 100,3:F0}% [{new string('#', filled)}{new string('-', BarWidth - filled)}] {Pixels(s.DonePixels)} of {Pixels(s.TotalPixels)}  {s.Finished}/{s.Count} pyramids  {rate}  ETA {eta}");
        return s.Current is null ? line : $"{line}  {s.Current}";
    }

    public static string Pixels(double pixels) => pixels switch
    {
        >= 1e9 => string.Create(CultureInfo.InvariantCulture, $"{pixels / 1e9:F2} Gpx"),
        >= 1e6 => string.Create(CultureInfo.InvariantCulture, $"{pixels / 1e6:F1} Mpx"),
        _ => string.Create(CultureInfo.InvariantCulture, $"{pixels / 1e3:F1} kpx"),
    };

    public static string Duration(TimeSpan t) => t.TotalHours >= 1
        ? string.Create(CultureInfo.InvariantCulture, $"{(int)t.TotalHours}:{t.Minutes:00}:{t.Seconds:00}")
        : string.Create(CultureInfo.InvariantCulture, $"{t.Minutes}:{t.Seconds:00}");
}
