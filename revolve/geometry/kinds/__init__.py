"""One module per segment kind, each keeping the contract of :class:`base.SegmentKind`.

The list of kinds and their constructors is :mod:`revolve.geometry.segments`.
"""
