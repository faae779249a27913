namespace Mosaic.Server.Hosting;

/// <summary>Who chose the GC heap's hard limit.</summary>
public enum HeapLimitSource
{
    /// <summary>The runtime was given one (DOTNET_GCHeapHardLimit, its percent form, or runtimeconfig.json): left as it is.</summary>
    Runtime,

    /// <summary>--heap-limit-mb.</summary>
    Option,

    /// <summary>The memory tier of the tile cache plus the working allowance.</summary>
    Derived,

    /// <summary>The server runs inside another program's process (a test host): that program's GC settings stand.</summary>
    Host,

    /// <summary>--heap-limit-mb 0: no limit from Mosaic; the GC's own (the machine's or container's memory).</summary>
    None,
}
