"""Decoding on a binary symmetric channel: coset leaders, exact error probabilities, simulation.

A binary symmetric channel (BSC) flips each transmitted bit independently with
crossover probability ``p``. For a binary linear ``[n, k]`` code this module gives

* the **coset-leader weight distribution** ``alpha_0, ..., alpha_rho`` (``alpha_i`` =
  number of cosets whose lightest word has weight ``i``) and the **covering radius**
  ``rho``, by breadth-first search over the ``2^(n-k)`` syndromes [1]_;
* three **exact probabilities** per ``p``, with ``q = 1 - p``:

  - block error of complete syndrome (minimum-distance) decoding [1]_ ::

        P_block = 1 - sum_i alpha_i p^i q^(n-i) = sum_i (C(n, i) - alpha_i) p^i q^(n-i)

  - undetected error when the code is used for error detection only [2]_ ::

        P_undetected = sum_{i >= 1} A_i p^i q^(n-i)        (A_i: weight distribution)

  - failure of a bounded-distance decoder of radius ``t = (d - 1) // 2`` (it corrects
    every pattern of at most ``t`` errors and nothing else) ::

        P_bdd = sum_{i > t} C(n, i) p^i q^(n-i)

  Every sum is taken over the complement directly (never as ``1 - ...``) with
  :func:`math.fsum`, so tiny probabilities keep their relative precision; with ``p``
  a :class:`fractions.Fraction` the result is an exact ``Fraction``;
* **Monte Carlo estimates** of the same three probabilities for codes too large for
  the exact sums, with a seeded generator and a confidence interval on every
  estimate. Two decoders: a syndrome table (complete minimum-distance decoding, for
  ``n - k`` up to :data:`TABLE_MAX_REDUNDANCY`) and an information-set decoder in the
  manner of ordered-statistics decoding [3]_, adapted to hard decisions.

The decoders decide from the coset of the received word only (adding a codeword to
the input adds it to the output), and the channel acts the same on every codeword,
so the probability of a decoding error does not depend on the codeword sent [1]_:
the simulation sends the all-zero codeword and draws the error patterns only.

:func:`channel_report` gathers all of these for one code into a
:class:`ChannelReport`, what ``gf2codes channel`` prints. The package's modules:
``leaders`` (coset leaders), ``probability`` (the exact sums), ``decoders``,
``simulation`` and ``channel`` (the report).

References
----------
.. [1] F. J. MacWilliams and N. J. A. Sloane, *The Theory of Error-Correcting Codes*,
   North-Holland, 1977, ch. 1, sections 3-5 (cosets, syndrome decoding, coset
   leaders, the probability of a decoding error).
.. [2] S. Lin and D. J. Costello, *Error Control Coding*, 2nd ed., Pearson, 2004,
   ch. 3, section 3.6 (probability of an undetected error for linear codes).
.. [3] M. P. C. Fossorier and S. Lin, "Soft-decision decoding of linear block codes
   based on ordered statistics", *IEEE Trans. Inform. Theory* 41(5), 1995,
   pp. 1379-1396, doi:10.1109/18.412683.
.. [4] C. J. Clopper and E. S. Pearson, "The use of confidence or fiducial limits
   illustrated in the case of the binomial", *Biometrika* 26(4), 1934, pp. 404-413;
   E. B. Wilson, "Probable inference, the law of succession, and statistical
   inference", *J. Amer. Statist. Assoc.* 22(158), 1927, pp. 209-212.
"""
from __future__ import annotations

from .channel import ChannelPoint, ChannelReport, channel_report
from .decoders import InformationSetDecoder, SyndromeDecoder
from .leaders import (
    DEFAULT_MAX_REDUNDANCY,
    TABLE_MAX_REDUNDANCY,
    CosetLeaders,
    coset_leader_distribution,
    covering_radius,
)
from .probability import (
    BSCPoint,
    block_error_probability,
    bounded_distance_failure_probability,
    bsc_performance,
    bsc_points,
    check_probability,
    undetected_error_probability,
)
from .simulation import (
    Estimate,
    SimulationResult,
    clopper_pearson_interval,
    simulate_bsc,
    wilson_interval,
)

__all__ = [
    "DEFAULT_MAX_REDUNDANCY",
    "TABLE_MAX_REDUNDANCY",
    "CosetLeaders",
    "coset_leader_distribution",
    "covering_radius",
    "check_probability",
    "block_error_probability",
    "undetected_error_probability",
    "bounded_distance_failure_probability",
    "BSCPoint",
    "bsc_performance",
    "SyndromeDecoder",
    "InformationSetDecoder",
    "Estimate",
    "SimulationResult",
    "simulate_bsc",
    "clopper_pearson_interval",
    "wilson_interval",
    "bsc_points",
    "ChannelPoint",
    "ChannelReport",
    "channel_report",
]
