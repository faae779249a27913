namespace Mosaic.Imaging.Display.Stretches;

/// <summary>The asinh softening: the value offset over which the curve turns from linear to logarithmic.</summary>
public readonly record struct Softening
{
    private Softening(double amount, SofteningUnit unit)
    {
        if (!(amount > 0) || !double.IsFinite(amount)) throw new ArgumentOutOfRangeException("soft", amount, "soft must be > 0 and finite");
        if (!Enum.IsDefined(unit)) throw new ArgumentOutOfRangeException(nameof(unit), unit, "unit must be Physical or Sigma");
        Amount = amount;
        Unit = unit;
    }

    public double Amount { get; }
    public SofteningUnit Unit { get; }

    /// <summary>True for default(Softening), which carries no amount and is refused by the stretches.</summary>
    public bool IsEmpty => Amount == 0;

    public static Softening Physical(double soft) => new(soft, SofteningUnit.Physical);

    public static Softening Sigmas(double sigmas) => new(sigmas, SofteningUnit.Sigma);

    public string CanonicalKey => Unit == SofteningUnit.Sigma ? KeyText.Number(Amount) + "sigma" : KeyText.Number(Amount);

    /// <summary>The softening in physical units for a field with this MAD sigma; NaN where sigma is unusable.</summary>
    public double PhysicalFor(double madSigma) => Unit == SofteningUnit.Sigma ? Amount * madSigma : Amount;
}
