namespace Mosaic.Demo.Numerics;

/// <summary>
/// Linear least squares by Householder QR (Golub &amp; Van Loan, "Matrix Computations", section 5.3). QR keeps the
/// conditioning of the design matrix; the normal equations would square it, which matters for 4th-order monomials.
/// </summary>
internal static class LeastSquares
{
    /// <summary>Minimises |design · x − target|; design is rows × unknowns with rows ≥ unknowns and full column rank.</summary>
    public static double[] Solve(double[,] design, double[] target)
    {
        var rows = design.GetLength(0);
        var cols = design.GetLength(1);
        if (target.Length != rows) throw new ArgumentException("target length must equal the number of design rows.", nameof(target));
        if (rows < cols) throw new ArgumentException($"{rows} equations cannot determine {cols} unknowns.", nameof(design));

        var a = (double[,])design.Clone();
        var b = (double[])target.Clone();
        var diagonal = new double[cols];
        for (var k = 0; k < cols; k++)
        {
            double norm = 0;
            for (var i = k; i < rows; i++) norm += a[i, k] * a[i, k];
            norm = Math.Sqrt(norm);
            if (norm == 0) throw new InvalidOperationException($"The design matrix is rank deficient at column {k}.");
            // Reflect onto the sign that avoids cancellation.
            var alpha = a[k, k] > 0 ? -norm : norm;
            a[k, k] -= alpha;
            double vv = 0;
            for (var i = k; i < rows; i++) vv += a[i, k] * a[i, k];
            for (var j = k + 1; j < cols; j++)
            {
                double s = 0;
                for (var i = k; i < rows; i++) s += a[i, k] * a[i, j];
                var f = 2 * s / vv;
                for (var i = k; i < rows; i++) a[i, j] -= f * a[i, k];
            }
            double sb = 0;
            for (var i = k; i < rows; i++) sb += a[i, k] * b[i];
            var fb = 2 * sb / vv;
            for (var i = k; i < rows; i++) b[i] -= fb * a[i, k];
            diagonal[k] = alpha;
        }

        var x = new double[cols];
        for (var k = cols - 1; k >= 0; k--)
        {
            var s = b[k];
            for (var j = k + 1; j < cols; j++) s -= a[k, j] * x[j];
            if (Math.Abs(diagonal[k]) < 1e-300) throw new InvalidOperationException($"The design matrix is singular at column {k}.");
            x[k] = s / diagonal[k];
        }
        return x;
    }
}
