using System.Reflection;
using Microsoft.AspNetCore.Mvc;
using Mosaic.Imaging.Composite;
using Mosaic.Imaging.Display;
using Mosaic.Server.Errors;

namespace Mosaic.Server.Endpoints;

/// <summary>
/// Turns the composite query parameters into <see cref="ICompositeSettings"/>. Parameters of the other mode are
/// checked but do not count, so equal composites however written share one canonical key. Every violation is a
/// 400 naming its parameter (a channel override by its prefixed name, e.g. blue-lo).
/// </summary>
public static class CompositeQuery
{
    public static readonly string[] Modes = [LuptonSettings.ModeName, PerBandSettings.ModeName];

    /// <summary>Display parameters a channel may override (palette and masked belong to the whole composite).</summary>
    private static readonly Dictionary<string, PropertyInfo> ChannelParameters = typeof(DisplayParameters).GetProperties()
        .Select(p => (Property: p, Name: p.GetCustomAttribute<FromQueryAttribute>()?.Name))
        .Where(p => p.Name is not null && p.Name != "palette" && p.Name != "masked" && !p.Name.StartsWith("ch-", StringComparison.Ordinal))
        .ToDictionary(p => p.Name!, p => p.Property, StringComparer.OrdinalIgnoreCase);

    /// <summary>Null where 'rgb' is absent (one band is shown); otherwise the bands and settings.</summary>
    public static CompositeRequest? Parse(CompositeParameters composite, DisplayParameters display, IQueryCollection query)
    {
        ArgumentNullException.ThrowIfNull(composite);
        ArgumentNullException.ThrowIfNull(display);
        ArgumentNullException.ThrowIfNull(query);
        var mode = QueryParameters.OptionalChoice("rgb", composite.Rgb, Modes);
        if (mode is null) return null;

        var bands = new Channels<string>(
            Required(ChannelNames.Red, composite.Red), Required(ChannelNames.Green, composite.Green), Required(ChannelNames.Blue, composite.Blue));
        if (!string.IsNullOrWhiteSpace(display.Palette))
            throw MosaicRequestException.BadParameter("palette",
                "'palette' cannot be used with 'rgb': the composite gives each band its own colour channel. Leave 'palette' out, or drop 'rgb' to show one band with a palette.");
        var overrides = ChannelOverrides(query);
        var masked = string.IsNullOrWhiteSpace(display.Masked)
            ? MaskedColor.Transparent
            : Build("masked", () => MaskedColor.Parse(display.Masked.Trim()));
        var scale = Triple("scale", composite.Scale, allowOne: false);
        if (scale is { } s)
            foreach (var weight in s.AsEnumerable())
                if (!(weight > 0)) throw MosaicRequestException.BadParameter("scale", $"'scale' must be three weights > 0; got '{composite.Scale}'.");

        // Both modes' parameters are checked, whichever counts.
        var lupton = ParseLupton(composite, scale, masked);
        var perBand = ParsePerBand(display, overrides, scale, masked);
        return new CompositeRequest(bands, mode == LuptonSettings.ModeName ? lupton : perBand);
    }

    private static LuptonSettings ParseLupton(CompositeParameters p, Channels<double>? scale, MaskedColor masked)
    {
        var q = QueryParameters.OptionalFinite("q", p.Q);
        var range = QueryParameters.OptionalFinite("range", p.Range);
        var minimum = Triple("min", p.Min, allowOne: true);
        if (q is { } qv && !(qv > 0)) throw MosaicRequestException.BadParameter("q", $"'q' must be > 0; got {qv}.");
        if (range is { } rv && !(rv > 0)) throw MosaicRequestException.BadParameter("range", $"'range' must be > 0; got {rv}.");
        return Build("q", () => new LuptonSettings(q ?? LuptonSettings.DefaultQ, range, minimum, scale, masked));
    }

    private static PerBandSettings ParsePerBand(DisplayParameters display, Dictionary<string, Dictionary<string, string>> overrides,
        Channels<double>? scale, MaskedColor masked)
    {
        var settings = new DisplaySettings[3];
        for (var c = 0; c < 3; c++)
        {
            var channel = ChannelNames.All[c];
            var own = overrides[channel];
            var parameters = Copy(display);
            foreach (var (name, value) in own) ChannelParameters[name].SetValue(parameters, value);
            try
            {
                settings[c] = DisplayQuery.Parse(parameters);
            }
            catch (MosaicRequestException e) when (e.Parameter is { } bad && own.ContainsKey(bad))
            {
                // The fault is in this channel's override: name it as the query spelled it.
                throw MosaicRequestException.BadParameter($"{channel}-{bad}", e.Message.Replace($"'{bad}'", $"'{channel}-{bad}'", StringComparison.Ordinal));
            }
        }
        return Build("palette", () => new PerBandSettings(new Channels<DisplaySettings>(settings[0], settings[1], settings[2]), scale, masked));
    }

    /// <summary>red-*, green-*, blue-* query keys by channel and display parameter name; 400 for a name no channel has.</summary>
    private static Dictionary<string, Dictionary<string, string>> ChannelOverrides(IQueryCollection query)
    {
        var overrides = ChannelNames.All.AsEnumerable().ToDictionary(c => c, _ => new Dictionary<string, string>(StringComparer.OrdinalIgnoreCase));
        foreach (var (key, values) in query)
        {
            var dash = key.IndexOf('-', StringComparison.Ordinal);
            if (dash <= 0) continue;
            var channel = ChannelNames.All.AsEnumerable().FirstOrDefault(c => string.Equals(c, key[..dash], StringComparison.OrdinalIgnoreCase));
            if (channel is null) continue;
            var name = key[(dash + 1)..];
            if (!ChannelParameters.TryGetValue(name, out var property))
                throw MosaicRequestException.BadParameter(key,
                    $"'{key}' is not a per-channel display parameter; a channel overrides one of {string.Join(", ", ChannelParameters.Keys.Order(StringComparer.Ordinal))} (as {channel}-lo, ...). Palette and masked apply to the whole composite.");
            var canonical = property.GetCustomAttribute<FromQueryAttribute>()!.Name!;
            overrides[channel][canonical] = values.ToString();
        }
        return overrides;
    }

    private static DisplayParameters Copy(DisplayParameters display)
    {
        var copy = new DisplayParameters();
        foreach (var property in typeof(DisplayParameters).GetProperties()) property.SetValue(copy, property.GetValue(display));
        return copy;
    }

    private static string Required(string channel, string? band)
    {
        if (string.IsNullOrWhiteSpace(band))
            throw MosaicRequestException.BadParameter(channel, $"'rgb' needs a band for each of red, green and blue; '{channel}' is missing.");
        return band.Trim();
    }

    /// <summary>Three comma-separated finite numbers (or one, standing for all three, where allowed); null where absent.</summary>
    private static Channels<double>? Triple(string name, string? text, bool allowOne)
    {
        if (string.IsNullOrWhiteSpace(text)) return null;
        var parts = text.Split(',');
        if (parts.Length == 1 && allowOne)
        {
            var one = QueryParameters.RequiredFinite(name, parts[0]);
            return Channels<double>.All(one);
        }
        if (parts.Length != 3)
            throw MosaicRequestException.BadParameter(name,
                $"'{name}' must be {(allowOne ? "one number or " : "")}three comma-separated numbers (red, green, blue); got '{text}'.");
        var values = parts.Select(part =>
            double.TryParse(part.Trim(), System.Globalization.NumberStyles.Float, System.Globalization.CultureInfo.InvariantCulture, out var v) && double.IsFinite(v)
                ? v
                : throw MosaicRequestException.BadParameter(name, $"'{name}' must hold finite numbers; got '{text}'.")).ToArray();
        return new Channels<double>(values[0], values[1], values[2]);
    }

    private static T Build<T>(string parameter, Func<T> create)
    {
        try
        {
            return create();
        }
        catch (ArgumentException e)
        {
            var name = e.ParamName switch
            {
                "q" => "q",
                "range" => "range",
                "minimum" => "min",
                "scale" => "scale",
                "masked" => "masked",
                "palette" => "palette",
                _ => parameter,
            };
            var message = e.Message;
            var cut = message.IndexOf(" (Parameter '", StringComparison.Ordinal);
            throw MosaicRequestException.BadParameter(name, cut > 0 ? message[..cut] : message);
        }
    }
}
