namespace Mosaic.Server.Pyramids;

public enum PyramidState
{
    Queued,
    Building,
    Ready,
    Failed,
}
