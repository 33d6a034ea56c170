"""Four-point Lagrange interpolation weights on equally spaced nodes [1]_.

References
----------
.. [1] M. Abramowitz, I. A. Stegun, *Handbook of Mathematical Functions*, Dover, 1965,
   eq. 25.2.13 (four-point Lagrange interpolation).
"""
from __future__ import annotations

__all__ = ["cubic_weights"]


def cubic_weights(t: float) -> tuple[float, float, float, float]:
    """Weights of the nodes 0, 1, 2, 3 at position ``t`` (in node steps from node 0) [1]_.

    Parameters
    ----------
    t : float
        Position, [node steps]; inside [1, 2] the stencil is centred, outside it extrapolates less well.

    Returns
    -------
    tuple of float
        The four weights; they sum to 1.

    Examples
    --------
    >>> cubic_weights(1.0)
    (-0.0, 1.0, 0.0, -0.0)
    >>> round(sum(cubic_weights(1.37)), 12)
    1.0
    """
    t1, t2, t3 = t - 1.0, t - 2.0, t - 3.0
    return (-t1 * t2 * t3 / 6.0, t * t2 * t3 / 2.0, -t * t1 * t3 / 2.0, t * t1 * t2 / 6.0)
