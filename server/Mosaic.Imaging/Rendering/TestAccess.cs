using System.Runtime.CompilerServices;

// Lets the tests run each lookup path on one machine and compare them.
[assembly: InternalsVisibleTo("Mosaic.Imaging.Tests")]
