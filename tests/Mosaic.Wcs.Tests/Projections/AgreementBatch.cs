namespace Mosaic.Wcs.Tests.Projections;

/// <summary>
/// Many card sets sent to astropy in one python process (Reference/astropy_wcs.py takes a list), so a test class
/// pays for astropy's import once. Build one per class from its case table; each test looks its case up by name.
/// </summary>
internal sealed class AgreementBatch
{
    private readonly Dictionary<string, (AgreementCase Case, AstropyReference.Answer Answer)> _cases = new();

    public AgreementBatch(IEnumerable<(string Name, Dictionary<string, object> Cards)> cases)
        : this(cases.Select(c => AgreementCase.Prepare(c.Name, c.Cards)))
    {
    }

    public AgreementBatch(IEnumerable<AgreementCase> cases)
    {
        var prepared = cases.ToList();
        var answers = AstropyReference.TransformBatch(prepared.Select(c => ((IReadOnlyDictionary<string, object>)c.ReferenceCards, (IReadOnlyList<(double, double)>)c.Pixels, (IReadOnlyList<(double, double)>)c.Sky)).ToList());
        for (var k = 0; k < prepared.Count; k++) _cases.Add(prepared[k].Name, (prepared[k], answers[k]));
    }

    public AgreementCase.Result Verify(string name, bool expectUnsolved = false, bool repeatedPlane = false, double roundTripTolerance = 1e-6)
    {
        var (c, answer) = _cases[name];
        return c.Verify(answer, expectUnsolved, repeatedPlane, roundTripTolerance);
    }

    public AgreementCase Case(string name) => _cases[name].Case;
}
