using BenchmarkDotNet.Running;

// One switcher for every benchmark class in this assembly: pick with --filter, e.g. --filter '*PyramidBuild*'.
BenchmarkSwitcher.FromAssembly(typeof(Mosaic.Benchmarks.SkyTile).Assembly).Run(args);
