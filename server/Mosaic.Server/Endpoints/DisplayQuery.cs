using Mosaic.Imaging.Display;
using Mosaic.Imaging.Display.Limits;
using Mosaic.Imaging.Display.Palettes;
using Mosaic.Imaging.Display.Stretches;
using Mosaic.Server.Errors;

namespace Mosaic.Server.Endpoints;

/// <summary>
/// Turns the display query parameters into <see cref="DisplaySettings"/>. Names are case-insensitive, defaults are
/// filled in, and parameters of a stretch or palette other than the chosen one are checked but do not count, so
/// equal settings however written give one <see cref="DisplaySettings.CanonicalKey"/>. Every violation is a 400
/// naming its parameter.
/// </summary>
public static class DisplayQuery
{
    public const double DefaultLowerPercent = 0.5;
    public const double DefaultUpperPercent = 99.5;
    public const double DefaultSigmasBelow = 2;
    public const double DefaultSigmasAbove = 20;

    private static readonly string[] LimitKinds = ["auto", "value", "percentile", "robust"];
    private static readonly string[] StretchNames = ["linear", "sqrt", "power", "log", "asinh", "histeq"];

    // Most tile requests carry no display parameters (or only masked=transparent): those get one shared instance,
    // made by the full parse below, instead of a dozen allocations each. DisplaySettings is an immutable record.
    private static readonly Lazy<DisplaySettings> DefaultTransparent = new(() => ParseDefault(false));
    private static readonly Lazy<DisplaySettings> DefaultPaletteMasked = new(() => ParseDefault(true));

    // OnlyMaskedMayBeGiven names every parameter but 'masked'; a parameter added later must be added there too.
    private const int ParameterCount = 18;

    private static DisplaySettings ParseDefault(bool paletteMaskByDefault)
    {
        var count = typeof(DisplayParameters).GetProperties().Length;
        if (count != ParameterCount)
            throw new InvalidOperationException($"DisplayParameters has {count} parameters, DisplayQuery.OnlyMaskedMayBeGiven knows {ParameterCount}: add the new ones there.");
        return ParseGiven(new DisplayParameters(), paletteMaskByDefault);
    }

    /// <param name="parameters">The bound query.</param>
    /// <param name="paletteMaskByDefault">Without 'masked': the palette's own masked colour (true, render.png) or transparent (false, tiles).</param>
    public static DisplaySettings Parse(DisplayParameters parameters, bool paletteMaskByDefault = false)
    {
        ArgumentNullException.ThrowIfNull(parameters);
        if (OnlyMaskedMayBeGiven(parameters))
        {
            if (string.IsNullOrWhiteSpace(parameters.Masked))
                return paletteMaskByDefault ? DefaultPaletteMasked.Value : DefaultTransparent.Value;
            if (parameters.Masked.Trim().Equals(TransparentName, StringComparison.OrdinalIgnoreCase))
                return DefaultTransparent.Value;
        }
        return ParseGiven(parameters, paletteMaskByDefault);
    }

    private const string TransparentName = "transparent";

    private static bool OnlyMaskedMayBeGiven(DisplayParameters p) =>
        IsAbsent(p.Limits) && IsAbsent(p.Lo) && IsAbsent(p.Hi) && IsAbsent(p.Plo) && IsAbsent(p.Phi) && IsAbsent(p.Klo) && IsAbsent(p.Khi)
        && IsAbsent(p.Stretch) && IsAbsent(p.Gamma) && IsAbsent(p.A) && IsAbsent(p.Soft) && IsAbsent(p.Pivot) && IsAbsent(p.Palette)
        && IsAbsent(p.CubehelixStart) && IsAbsent(p.CubehelixRotations) && IsAbsent(p.CubehelixHue) && IsAbsent(p.CubehelixGamma);

    // The same test the parsers apply: absent, empty and blank all mean "not given".
    private static bool IsAbsent(string? text) => string.IsNullOrWhiteSpace(text);

    private static DisplaySettings ParseGiven(DisplayParameters parameters, bool paletteMaskByDefault)
    {
        var palette = ParsePalette(parameters);
        var masked = string.IsNullOrWhiteSpace(parameters.Masked)
            ? (paletteMaskByDefault ? MaskedColor.Of(palette.DefaultMaskedColor) : MaskedColor.Transparent)
            : Build("masked", () => MaskedColor.Parse(parameters.Masked.Trim()));
        return new DisplaySettings
        {
            Limits = ParseLimits(parameters),
            Stretch = ParseStretch(parameters),
            Palette = palette,
            Masked = masked,
        };
    }

    private static IValueLimits ParseLimits(DisplayParameters p)
    {
        var lo = QueryParameters.OptionalFinite("lo", p.Lo);
        var hi = QueryParameters.OptionalFinite("hi", p.Hi);
        var plo = QueryParameters.OptionalFinite("plo", p.Plo);
        var phi = QueryParameters.OptionalFinite("phi", p.Phi);
        var klo = QueryParameters.OptionalFinite("klo", p.Klo);
        var khi = QueryParameters.OptionalFinite("khi", p.Khi);

        // Which kinds the present parameters belong to, each with the first parameter that shows it.
        var present = new List<(string Kind, string Parameter)>();
        if (lo is not null || hi is not null) present.Add(("value", lo is not null ? "lo" : "hi"));
        if (plo is not null || phi is not null) present.Add(("percentile", plo is not null ? "plo" : "phi"));
        if (klo is not null || khi is not null) present.Add(("robust", klo is not null ? "klo" : "khi"));

        var kind = QueryParameters.OptionalChoice("limits", p.Limits, LimitKinds);
        if (kind is null)
        {
            if (present.Count > 1)
                throw MosaicRequestException.BadParameter(present[1].Parameter,
                    $"'{present[1].Parameter}' ({present[1].Kind} limits) cannot be combined with '{present[0].Parameter}' ({present[0].Kind} limits): choose one kind.");
            kind = present.Count == 1 ? present[0].Kind : "auto";
        }
        foreach (var (other, parameter) in present)
            if (other != kind)
                throw MosaicRequestException.BadParameter(parameter, $"'{parameter}' belongs to limits={other}, but limits={kind}.");

        switch (kind)
        {
            case "value":
                if (lo is null) throw MosaicRequestException.BadParameter("lo", "limits=value needs both 'lo' and 'hi'; 'lo' is missing.");
                if (hi is null) throw MosaicRequestException.BadParameter("hi", "limits=value needs both 'lo' and 'hi'; 'hi' is missing.");
                if (!(lo < hi)) throw MosaicRequestException.BadParameter("hi", $"'hi' ({hi}) must be greater than 'lo' ({lo}).");
                return Build("hi", () => new ManualLimits(lo.Value, hi.Value));
            case "percentile":
            {
                var lower = plo ?? DefaultLowerPercent;
                var upper = phi ?? DefaultUpperPercent;
                if (lower < 0 || lower >= 100) throw MosaicRequestException.BadParameter("plo", $"'plo' must be in [0, 100); got {lower}.");
                if (upper <= 0 || upper > 100) throw MosaicRequestException.BadParameter("phi", $"'phi' must be in (0, 100]; got {upper}.");
                if (!(lower < upper)) throw MosaicRequestException.BadParameter("phi", $"'phi' ({upper}) must be greater than 'plo' ({lower}).");
                return Build("phi", () => new PercentileLimits(lower, upper));
            }
            case "robust":
            {
                var below = klo ?? DefaultSigmasBelow;
                var above = khi ?? DefaultSigmasAbove;
                if (below < 0) throw MosaicRequestException.BadParameter("klo", $"'klo' must be ≥ 0; got {below}.");
                if (!(above > 0)) throw MosaicRequestException.BadParameter("khi", $"'khi' must be > 0; got {above}.");
                return Build("khi", () => new RobustLimits(below, above));
            }
            default:
                return DisplaySettings.Default.Limits;
        }
    }

    private static IStretch ParseStretch(DisplayParameters p)
    {
        var gamma = QueryParameters.OptionalFinite("gamma", p.Gamma);
        var a = QueryParameters.OptionalFinite("a", p.A);
        var soft = QueryParameters.OptionalFinite("soft", p.Soft);
        var pivot = ParsePivot(p.Pivot);
        if (gamma is { } g && !(g > 0)) throw MosaicRequestException.BadParameter("gamma", $"'gamma' must be > 0; got {g}.");
        if (a is { } av && !(av > 0)) throw MosaicRequestException.BadParameter("a", $"'a' must be > 0; got {av}.");
        if (soft is { } s && !(s > 0)) throw MosaicRequestException.BadParameter("soft", $"'soft' must be > 0; got {s}.");

        return (QueryParameters.OptionalChoice("stretch", p.Stretch, StretchNames) ?? "asinh") switch
        {
            "linear" => new LinearStretch(),
            "sqrt" => new SqrtStretch(),
            "power" => Build("gamma", () => new PowerStretch(gamma ?? PowerStretch.DefaultGamma)),
            "log" => Build("a", () => new LogStretch(a ?? LogStretch.DefaultA)),
            "histeq" => new HistEqStretch(),
            _ => Build("soft", () => new AsinhStretch(
                soft is { } physical ? Softening.Physical(physical) : Softening.Sigmas(DisplaySettings.DefaultSoftSigmas),
                pivot ?? AsinhPivot.AtLo)),
        };
    }

    private static AsinhPivot? ParsePivot(string? text)
    {
        if (string.IsNullOrWhiteSpace(text)) return null;
        var trimmed = text.Trim();
        if (trimmed.Equals("lo", StringComparison.OrdinalIgnoreCase)) return AsinhPivot.AtLo;
        if (trimmed.Equals("median", StringComparison.OrdinalIgnoreCase)) return AsinhPivot.AtMedian;
        if (!double.TryParse(trimmed, System.Globalization.NumberStyles.Float, System.Globalization.CultureInfo.InvariantCulture, out var value) || !double.IsFinite(value))
            throw MosaicRequestException.BadParameter("pivot", $"'pivot' must be 'lo', 'median' or a finite number; got '{text}'.");
        return Build("pivot", () => AsinhPivot.At(value));
    }

    private static IPalette ParsePalette(DisplayParameters p)
    {
        var start = QueryParameters.OptionalFinite("ch-start", p.CubehelixStart);
        var rotations = QueryParameters.OptionalFinite("ch-rot", p.CubehelixRotations);
        var hue = QueryParameters.OptionalFinite("ch-hue", p.CubehelixHue);
        var gamma = QueryParameters.OptionalFinite("ch-gamma", p.CubehelixGamma);
        if (start is { } s && !(s >= 0 && s <= 3)) throw MosaicRequestException.BadParameter("ch-start", $"'ch-start' must be in [0, 3]; got {s}.");
        if (rotations is { } r && !(r >= -10 && r <= 10)) throw MosaicRequestException.BadParameter("ch-rot", $"'ch-rot' must be in [-10, 10]; got {r}.");
        if (hue is { } h && !(h >= 0 && h <= 3)) throw MosaicRequestException.BadParameter("ch-hue", $"'ch-hue' must be in [0, 3]; got {h}.");
        if (gamma is { } g && !(g > 0 && g <= 10)) throw MosaicRequestException.BadParameter("ch-gamma", $"'ch-gamma' must be > 0 and ≤ 10; got {g}.");

        var name = QueryParameters.OptionalChoice("palette", p.Palette, PaletteCatalog.Names) ?? GrayPalette.PaletteName;
        if (name != CubehelixPalette.PaletteName) return Build("palette", () => PaletteCatalog.Create(name));
        var parameters = Build("ch-start", () => new CubehelixParameters(
            start ?? CubehelixParameters.DefaultStart, rotations ?? CubehelixParameters.DefaultRotations,
            hue ?? CubehelixParameters.DefaultHue, gamma ?? CubehelixParameters.DefaultGamma));
        return Build("palette", () => PaletteCatalog.Create(name, parameters));
    }

    /// <summary>Runs a constructor of the display library; its ArgumentException becomes a 400 naming the parameter (its own name where it gives one we use).</summary>
    private static T Build<T>(string parameter, Func<T> create)
    {
        try
        {
            return create();
        }
        catch (ArgumentException e)
        {
            throw MosaicRequestException.BadParameter(QueryName(e.ParamName) ?? parameter, StripParameterSuffix(e));
        }
    }

    private static readonly Dictionary<string, string> LibraryNames = new(StringComparer.Ordinal)
    {
        ["lo"] = "lo", ["hi"] = "hi", ["gamma"] = "gamma", ["a"] = "a", ["soft"] = "soft", ["pivot"] = "pivot",
        ["masked"] = "masked", ["palette"] = "palette", ["start"] = "ch-start", ["rotations"] = "ch-rot", ["hue"] = "ch-hue",
        ["lowerPercent"] = "plo", ["upperPercent"] = "phi", ["sigmasBelow"] = "klo", ["sigmasAbove"] = "khi",
    };

    private static string? QueryName(string? libraryName) =>
        libraryName is not null && LibraryNames.TryGetValue(libraryName, out var name) ? name : null;

    /// <summary>ArgumentException appends " (Parameter 'x')" to its message; the problem names the parameter on its own.</summary>
    private static string StripParameterSuffix(ArgumentException e)
    {
        var message = e.Message;
        var cut = message.IndexOf(" (Parameter '", StringComparison.Ordinal);
        return cut > 0 ? message[..cut] : message;
    }
}
