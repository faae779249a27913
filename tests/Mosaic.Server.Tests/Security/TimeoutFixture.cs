using Mosaic.Testing;

namespace Mosaic.Server.Tests.Security;

/// <summary>The hostile data folder plus a 2000 x 2000 field, with a render timeout far shorter than rendering it takes.</summary>
public sealed class TimeoutFixture : HostileDataFixture
{
    public const string BigField = "big";

    public TimeoutFixture() : base(new Dictionary<string, string> { ["render-timeout"] = "0.005" })
    {
        DebianPython.RunCode("""
import sys
import numpy as np
from astropy.io import fits
fits.PrimaryHDU(np.random.default_rng(3).normal(100, 10, size=(2000, 2000)).astype(np.float32)).writeto(sys.argv[1])
print("ok")
""", [Path.Combine(DataDirectory, BigField + ".fits")]);
    }
}
