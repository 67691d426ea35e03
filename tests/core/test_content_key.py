"""Content keys (``core.content_key``): equal only for values that hold exactly the same thing, and
no key at all for a value that cannot be described exactly (so nothing is cached for it).

Expected outcomes follow from the values themselves: arrays that differ in one element (inside the
part numpy's own ``repr`` leaves out), floats one unit in the last place apart, objects that print
only their address.
"""

from __future__ import annotations

from dataclasses import dataclass

import numpy as np

from calcpad.core.content_key import content_key
from calcpad.core.units import Q_


@dataclass
class _Part:
    name: str
    values: np.ndarray


class _Plain:
    def __init__(self, d: float) -> None:
        self.d = d


def test_equal_content_gives_equal_keys():
    a = np.linspace(0.0, 1.0, 5000)
    assert content_key("frame", {"A": (0.0, 1.5)}, a, Q_(35.0, "ksi")) == content_key("frame", {"A": (0.0, 1.5)}, a.copy(),
                                                                                         Q_(35.0, "ksi"))
    assert content_key(_Plain(2.375)) == content_key(_Plain(2.375))


def test_any_difference_gives_another_key():
    a = np.linspace(0.0, 1.0, 5000)
    b = a.copy()
    b[2500] += 1e-9  # numpy's repr of a long array elides the middle: the key does not
    assert content_key(a) != content_key(b)
    assert content_key(_Part("leg", a)) != content_key(_Part("leg", b))
    assert content_key(0.1 + 0.2) != content_key(0.3)  # one unit in the last place
    assert content_key(Q_(1.0, "ft")) != content_key(Q_(12.0, "in"))  # equal lengths, other text printed
    assert content_key(_Plain(2.375)) != content_key(_Plain(2.5))
    assert content_key(a.astype(np.float32)) != content_key(a)


def test_a_value_known_only_by_its_address_has_no_key():
    class Slotted:
        __slots__ = ("d",)

        def __init__(self) -> None:
            self.d = 1.0

    assert content_key(Slotted()) is None
    assert content_key(1.0, [Slotted()]) is None
