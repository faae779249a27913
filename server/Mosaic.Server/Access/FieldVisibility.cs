using Mosaic.Server.Fields;

namespace Mosaic.Server.Access;

/// <summary>Which fields are private: named by --private-fields, or marked by a file (see <see cref="Field.IsPrivate"/>).</summary>
public sealed class FieldVisibility(AccessOptions options, FieldCatalog catalog)
{
    public bool IsPrivate(string fieldId) =>
        options.PrivateFields.Contains(fieldId)
        || catalog.Fields.Any(f => f.IsPrivate && string.Equals(f.Id, fieldId, StringComparison.Ordinal));

    public bool CanSee(Caller caller, string fieldId) =>
        caller.Kind == CallerKind.Full || caller.CanSee(fieldId, IsPrivate(fieldId));
}
