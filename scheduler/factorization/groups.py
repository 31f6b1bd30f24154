"""Finite abelian groups of odd order, as integer codes with numpy tables, for starters.

Elements are the codes ``0..m-1`` and the identity is ``0``. A group is stored as its digit
moduli (mixed radix, first modulus least significant) together with a commutative ring
multiplication on the same codes, used only for *multipliers* (automorphisms ``x -> u x``) in
the starter search:

* ``cyclic(m)``: ``Z_m`` with multiplication mod ``m``;
* ``product(a, b, ...)``: ``Z_a x Z_b x ...`` with componentwise multiplication;
* ``galois_field(q)``: the additive group of ``GF(q)``, ``q = p^k``, codes are the coefficient
  vectors of polynomials over ``Z_p`` of degree ``< k`` read in base ``p``, multiplication modulo
  a monic irreducible polynomial found by exhaustive search (the lexicographically first one
  whose field has a primitive element ``x``, i.e. a primitive polynomial).

Reference for the finite-field construction: R. Lidl and H. Niederreiter, *Finite Fields*,
Cambridge University Press 1997, ch. 2 (standard textbook material).
"""

from __future__ import annotations

import itertools
import math
import re
from dataclasses import dataclass, field

import numpy as np

from scheduler.errors import InputError

MAX_ORDER = 4096
"""Largest group order with full addition/multiplication tables (m*m entries)."""


@dataclass(frozen=True, eq=False)
class AbelianGroup:
    """An abelian group of odd order ``m`` on the codes ``0..m-1`` (identity ``0``).

    ``name`` is a readable description that :func:`group_from_name` parses back
    (``"Z_15"``, ``"Z_3 x Z_5"``, ``"GF(27)"``). ``add[a, b]``, ``neg[a]`` and ``mul[a, b]`` are
    numpy tables.

    Build groups with :func:`cyclic`, :func:`product`, :func:`galois_field` or
    :func:`group_from_name`, which check the order and make consistent tables.

    Parameters
    ----------
    name : str
        The readable name, parsed back by :func:`group_from_name`.
    moduli : tuple of int
        The digit moduli of the codes (mixed radix, first modulus least significant).
    kind : {"cyclic", "product", "field"}
        The construction, which decides the multiplication.
    add : numpy.ndarray
        ``(m, m)`` table of the group operation.
    neg : numpy.ndarray
        ``(m,)`` table of inverses.
    mul : numpy.ndarray
        ``(m, m)`` table of the ring multiplication (for multipliers).
    poly : tuple of int, optional
        For a field: the lower coefficients ``c_0 .. c_{k-1}`` of its primitive polynomial.

    References
    ----------
    R. Lidl and H. Niederreiter, *Finite Fields*, Cambridge University Press 1997, ch. 2.

    Examples
    --------
    >>> group = product(3, 5)
    >>> group.name, group.order, group.label(7)
    ('Z_3 x Z_5', 15, '(1,2)')
    >>> group.label(int(group.add[7, 7]))  # (1,2) + (1,2) = (2,4)
    '(2,4)'
    """

    name: str
    moduli: tuple[int, ...]
    kind: str  # "cyclic", "product" or "field"
    add: np.ndarray = field(repr=False)
    neg: np.ndarray = field(repr=False)
    mul: np.ndarray = field(repr=False)
    poly: tuple[int, ...] = ()

    @property
    def order(self) -> int:
        """The number of elements ``m``."""
        return int(self.add.shape[0])

    def digits(self, x: int) -> tuple[int, ...]:
        """Mixed-radix digits of code ``x`` (first modulus least significant).

        Parameters
        ----------
        x : int
            An element's code, ``0 <= x < m``.

        Returns
        -------
        tuple of int
            One digit per modulus.
        """
        out = []
        for mod in self.moduli:
            out.append(x % mod)
            x //= mod
        return tuple(out)

    def label(self, x: int) -> str:
        """Human-readable element: ``"7"`` in ``Z_m``, ``"(1,2)"`` in a product or a field.

        Parameters
        ----------
        x : int
            An element's code.

        Returns
        -------
        str
            The label, as used in certificates and reports.
        """
        if self.kind == "cyclic":
            return str(x)
        return "(" + ",".join(str(d) for d in self.digits(x)) + ")"

    def units(self) -> list[int]:
        """Codes ``u`` for which ``x -> u x`` is a bijection (the ring's units).

        Returns
        -------
        list of int
            The units' codes, increasing.

        Examples
        --------
        >>> cyclic(9).units()
        [1, 2, 4, 5, 7, 8]
        """
        m = self.order
        return [u for u in range(m) if len(np.unique(self.mul[u])) == m]

    def multiplier(self, u: int) -> np.ndarray:
        """The automorphism ``x -> u x`` as a permutation array; ``u`` must be a unit.

        Parameters
        ----------
        u : int
            A unit's code.

        Returns
        -------
        numpy.ndarray
            ``perm[x]`` is the code of ``u x``.

        Raises
        ------
        InputError
            When ``u`` is not a unit.

        Examples
        --------
        >>> cyclic(7).multiplier(3).tolist()
        [0, 3, 6, 2, 5, 1, 4]
        """
        perm = self.mul[u].copy()
        if len(np.unique(perm)) != self.order:
            raise InputError(f"{self.label(u)} is not a unit of {self.name}", location="multiplier")
        return perm

    def element_order_mul(self, u: int) -> int:
        """Multiplicative order of the unit ``u``.

        Parameters
        ----------
        u : int
            A unit's code.

        Returns
        -------
        int
            The least ``k >= 1`` with ``u^k = 1``.

        Examples
        --------
        >>> cyclic(7).element_order_mul(3), cyclic(7).element_order_mul(2)
        (6, 3)
        """
        k, x = 1, u
        while x != 1 % self.order:
            x = int(self.mul[x, u])
            k += 1
        return k


def _mixed_tables(moduli: tuple[int, ...]) -> tuple[np.ndarray, np.ndarray, np.ndarray]:
    """Addition, negation and componentwise multiplication for ``Z_a x Z_b x ...``."""
    m = math.prod(moduli)
    codes = np.arange(m)
    digits = []
    rest = codes.copy()
    for mod in moduli:
        digits.append(rest % mod)
        rest //= mod
    add = np.zeros((m, m), dtype=np.int32)
    mul = np.zeros((m, m), dtype=np.int32)
    neg = np.zeros(m, dtype=np.int32)
    weight = 1
    for mod, d in zip(moduli, digits, strict=True):
        add += (((d[:, None] + d[None, :]) % mod) * weight).astype(np.int32)
        mul += (((d[:, None] * d[None, :]) % mod) * weight).astype(np.int32)
        neg += (((-d) % mod) * weight).astype(np.int32)
        weight *= mod
    return add, neg, mul


def _check_order(m: int) -> None:
    if isinstance(m, bool) or not isinstance(m, int) or m < 1 or m % 2 == 0:
        raise InputError(f"a starter group needs an odd order >= 1, got {m!r}", location="group")
    if m > MAX_ORDER:
        raise InputError(f"group order {m} is above the supported {MAX_ORDER}", location="group")


def cyclic(m: int) -> AbelianGroup:
    """The cyclic group ``Z_m`` (``m`` odd) with multiplication mod ``m``.

    Parameters
    ----------
    m
        The odd order.

    Returns
    -------
    AbelianGroup
        The group with its addition, negation and multiplication tables.

    Raises
    ------
    InputError
        For an even or non-positive order, or one above :data:`MAX_ORDER`.

    Examples
    --------
    >>> group = cyclic(7)
    >>> group.name, group.order, int(group.add[5, 4]), int(group.mul[3, 5])
    ('Z_7', 7, 2, 1)
    """
    _check_order(m)
    add, neg, mul = _mixed_tables((m,))
    return AbelianGroup(f"Z_{m}", (m,), "cyclic", add, neg, mul)


def product(*moduli: int) -> AbelianGroup:
    """``Z_a x Z_b x ...`` (each modulus odd), componentwise multiplication.

    Parameters
    ----------
    *moduli
        The odd moduli of the factors.

    Returns
    -------
    AbelianGroup
        The direct product, named ``"Z_a x Z_b"``.

    Raises
    ------
    InputError
        For no modulus, or an order :func:`cyclic` refuses.

    Examples
    --------
    >>> product(3, 3).name, product(3, 3).order
    ('Z_3 x Z_3', 9)
    >>> product(5).name  # one factor: the cyclic group
    'Z_5'
    """
    if not moduli:
        raise InputError("a product group needs at least one factor", location="group")
    for mod in moduli:
        _check_order(mod)
    _check_order(math.prod(moduli))
    if len(moduli) == 1:
        return cyclic(moduli[0])
    add, neg, mul = _mixed_tables(tuple(moduli))
    name = " x ".join(f"Z_{mod}" for mod in moduli)
    return AbelianGroup(name, tuple(moduli), "product", add, neg, mul)


def prime_power(q: int) -> tuple[int, int] | None:
    """``(p, k)`` with ``q = p^k`` and ``p`` prime, or ``None``.

    Parameters
    ----------
    q : int
        The number to factor.

    Returns
    -------
    tuple of (int, int) or None
        ``(p, k)``; None when ``q`` is not a prime power (or is below 2).

    Examples
    --------
    >>> prime_power(27), prime_power(15)
    ((3, 3), None)
    """
    if q < 2:
        return None
    p = next(d for d in range(2, q + 1) if q % d == 0)
    k, r = 0, q
    while r % p == 0:
        r //= p
        k += 1
    return (p, k) if r == 1 else None


def _powers_of_x(p: int, k: int, poly: tuple[int, ...]) -> list[int] | None:
    """Codes of ``x^0, x^1, ..., x^(q-2)`` in ``Z_p[x] / (x^k + poly[k-1] x^(k-1) + ...
    + poly[0])`` when ``x`` has order ``q - 1`` there (``poly`` primitive), else ``None``."""
    q = p**k
    vec = [1] + [0] * (k - 1)
    codes = []
    seen = set()
    for _ in range(q - 1):
        code = sum(c * p**t for t, c in enumerate(vec))
        if code in seen:
            return None
        seen.add(code)
        codes.append(code)
        # multiply by x: shift up, reduce x^k = -(poly[0] + ... + poly[k-1] x^(k-1))
        top = vec[-1]
        vec = [0, *vec[:-1]]
        if top:
            vec = [(c - top * poly[t]) % p for t, c in enumerate(vec)]
    return codes


def galois_field(q: int) -> AbelianGroup:
    """The additive group of ``GF(q)`` (``q`` an odd prime power) with field multiplication.

    The polynomial is the first primitive one in lexicographic order of its coefficient vector
    ``(c_0, ..., c_{k-1})`` of ``x^k + c_{k-1} x^{k-1} + ... + c_0``; multiplication uses
    discrete logarithms to the base ``x`` (Lidl and Niederreiter, ch. 2 and 9).

    Parameters
    ----------
    q
        An odd prime power.

    Returns
    -------
    AbelianGroup
        The additive group, named ``"GF(q)"``, with the field's multiplication table.

    Raises
    ------
    InputError
        When ``q`` is not an odd prime power.

    References
    ----------
    R. Lidl and H. Niederreiter, *Finite Fields*, Cambridge University Press, ch. 2 and 9.

    Examples
    --------
    >>> field = galois_field(9)
    >>> field.name, field.poly  # x^2 + x + 2 is primitive over Z_3
    ('GF(9)', (2, 1))
    >>> sorted(field.units()) == list(range(1, 9))  # a field: every non-zero element is a unit
    True
    """
    _check_order(q)
    pk = prime_power(q)
    if pk is None:
        raise InputError(f"GF(q) needs a prime power q, got {q}", location="group")
    p, k = pk
    if k == 1:
        g = cyclic(p)
        return AbelianGroup(f"GF({q})", (p,), "field", g.add, g.neg, g.mul, (0,))
    add, neg, _ = _mixed_tables((p,) * k)
    for poly in itertools.product(range(p), repeat=k):
        if poly[0] == 0:
            continue
        powers = _powers_of_x(p, k, poly)
        if powers is None:
            continue
        exp = np.array(powers, dtype=np.int64)
        log = np.zeros(q, dtype=np.int64)
        log[exp] = np.arange(q - 1)
        logs = (log[1:, None] + log[None, 1:]) % (q - 1)
        mul = np.zeros((q, q), dtype=np.int32)
        mul[1:, 1:] = exp[logs]
        return AbelianGroup(f"GF({q})", (p,) * k, "field", add, neg, mul, tuple(poly))
    raise AssertionError(f"no primitive polynomial found for GF({q})")  # pragma: no cover


_NAME_CYCLIC = re.compile(r"^Z_(\d+)$")
_NAME_FIELD = re.compile(r"^GF\((\d+)\)$")


def group_from_name(name: str) -> AbelianGroup:
    """Parse ``"Z_15"``, ``"Z_3 x Z_5"`` or ``"GF(27)"`` back into a group.

    Parameters
    ----------
    name
        The group's name as :attr:`AbelianGroup.name` writes it.

    Returns
    -------
    AbelianGroup
        The group.

    Raises
    ------
    InputError
        For a name that is not one of the three forms.

    Examples
    --------
    >>> group_from_name("Z_3 x Z_5").name
    'Z_3 x Z_5'
    """
    text = name.strip()
    if match := _NAME_FIELD.match(text):
        return galois_field(int(match.group(1)))
    parts = [part.strip() for part in text.split("x")]
    moduli = []
    for part in parts:
        match = _NAME_CYCLIC.match(part)
        if not match:
            raise InputError(f"unknown group description {name!r}", location="group")
        moduli.append(int(match.group(1)))
    return product(*moduli) if len(moduli) > 1 else cyclic(moduli[0])


def groups_of_order(m: int) -> list[AbelianGroup]:
    """Useful groups of odd order ``m``: ``Z_m``, ``GF(m)`` when ``m`` is a prime power with
    exponent > 1, and ``Z_p x Z_{m/p}`` splittings with ``gcd = p`` (non-cyclic products).

    Parameters
    ----------
    m
        The odd order.

    Returns
    -------
    list of AbelianGroup
        ``Z_m`` first, then the others.

    Examples
    --------
    >>> [group.name for group in groups_of_order(9)]
    ['Z_9', 'GF(9)']
    """
    _check_order(m)
    out = [cyclic(m)]
    pk = prime_power(m)
    if pk is not None and pk[1] > 1:
        out.append(galois_field(m))
    for p in range(3, math.isqrt(m) + 1, 2):
        if m % p == 0 and math.gcd(p, m // p) > 1 and (pk is None or pk[1] > 2):
            out.append(product(p, m // p))
    return out
