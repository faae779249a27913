using System.Text.Json;

namespace Mosaic.Imaging.Tests.Statistics;

/// <summary>
/// Synthetic value samples made by numpy (Debian python3-numpy) with their reference statistics: numpy's
/// nanpercentile (default linear method), nanmedian, nanmin/nanmax, mean and the median absolute deviation,
/// each with the error bound a 2^-11-relative histogram bin allows (derived in the script).
/// </summary>
public sealed class ReferenceSamples : IDisposable
{
    public static readonly string[] Names = ["sky", "zero_crossing", "wide_range", "counts", "constant"];

    private const string Script = """
        W = 2.0 ** -11  # relative width of a histogram bin: 20-bit key = sign + 8 exponent + 11 mantissa bits
        P = [0.0, 0.1, 1.0, 2.5, 16.0, 25.0, 50.0, 75.0, 84.0, 97.5, 99.0, 99.9, 100.0]
        rng = np.random.default_rng(271828)

        def sprinkle(x, share):
            x[rng.random(x.size) < share] = np.nan
            return x

        sky = rng.normal(500.0, 50.0, 400_000)
        bright = rng.integers(0, sky.size, 2_000)
        sky[bright] += rng.exponential(5_000.0, bright.size)
        zero = sprinkle(rng.normal(0.0, 1.0, 300_000), 0.01)
        zero[:3] = [np.inf, -np.inf, np.inf]
        wide = rng.choice([-1.0, 1.0], 300_000) * rng.lognormal(0.0, 4.0, 300_000)
        samples = {
            "sky": sprinkle(sky, 0.03),
            "zero_crossing": zero,
            "wide_range": wide,
            "counts": rng.poisson(20.0, 200_000).astype(np.float64),
            "constant": sprinkle(np.full(5_000, 7.25), 0.1),
        }

        for name, x in samples.items():
            x = x.astype('<f4')
            x.tofile(name + '.f32')
            v = x[np.isfinite(x)].astype(np.float64)
            s = np.sort(v)
            n = s.size

            def bound(sorted_values, p):
                # The estimate lies in the bin of the order statistic at floor(rank); numpy's value lies between
                # that statistic and the next: one bin at either, plus the gap between them.
                h = p / 100.0 * (sorted_values.size - 1)
                k = int(np.floor(h))
                k1 = min(k + 1, sorted_values.size - 1)
                a, b = sorted_values[k], sorted_values[k1]
                return W * max(abs(a), abs(b)) + (b - a)

            x64 = x.astype(np.float64)
            x64[~np.isfinite(x64)] = np.nan  # ±inf count as masked, like NaN
            quantiles = [{"p": p, "value": float(np.nanpercentile(x64, p)), "tolerance": float(bound(s, p))} for p in P]
            median = float(np.nanmedian(x64))
            deviations = np.sort(np.abs(v - median))
            mad = float(np.median(deviations))
            # Median's bound, one bin at each end of median ± d, and the gap of the deviations at their median.
            k = (deviations.size - 1) // 2
            gap = deviations[min(k + 2, deviations.size - 1)] - deviations[max(k - 1, 0)]
            mad_tolerance = bound(s, 50.0) + 2 * W * (abs(median) + mad) + gap
            probes = []
            for p in [1.0, 10.0, 50.0, 90.0, 99.0]:
                q = float(np.percentile(v, p)) * 1.0001 + 1e-6
                near = np.count_nonzero(np.abs(v - q) <= W * abs(q) * 1.0001)
                probes.append({"value": q, "fraction": float(np.count_nonzero(v <= q) / n), "tolerance": float((near + 1) / n)})
            out = {
                "finite": int(n),
                "masked": int(np.count_nonzero(~np.isfinite(x))),
                "min": float(np.nanmin(v)), "max": float(np.nanmax(v)),
                "mean": float(np.mean(v)), "meanScale": float(np.mean(np.abs(v))),
                "quantiles": quantiles,
                "median": median, "medianTolerance": float(bound(s, 50.0)),
                "madSigma": 1.4826 * mad, "madSigmaTolerance": float(1.4826 * mad_tolerance),
                "probes": probes,
            }
            with open(name + '.json', 'w') as f:
                json.dump(out, f, allow_nan=False)
        """;

    public ReferenceSamples()
    {
        Folder = Directory.CreateTempSubdirectory("mosaic-stats-").FullName;
        ReferencePython.Run(Script, Folder);
    }

    public string Folder { get; }

    public float[] Values(string name) => ReferencePython.ReadFloat32(Path.Combine(Folder, name + ".f32"));

    public JsonElement Expected(string name) => ReferencePython.ReadJson(Path.Combine(Folder, name + ".json"));

    public void Dispose() => Directory.Delete(Folder, recursive: true);
}
