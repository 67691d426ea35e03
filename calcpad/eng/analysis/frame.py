"""Linear-elastic 2D frame analysis by the direct stiffness method.

Members are Euler-Bernoulli beam-columns with axial deformation (E, A, I), optional moment
releases (hinges) at either end; supports fix any of the three node freedoms; loads are node
forces/moments, uniform member loads and point loads on members, grouped in load cases. The
stiffness matrix is factorised once and every load case is solved in one go (many right-hand
sides); combinations are linear sums of the case results.

Global axes: x to the right, y up, rotations counter-clockwise. Member local x runs from the
start node to the end node, local y is local x turned 90 degrees counter-clockwise. Internal
forces: N tension positive; M positive when it puts the local -y face in tension (sagging for a
member drawn left to right); V = dM/dx.

Inputs are values with units (pint quantities or strings) or plain numbers in the frame's
``force_unit`` and ``length_unit``; inside, everything is a float in those units.
"""

from __future__ import annotations

from dataclasses import dataclass, field
from typing import Any

import numpy as np
import pint
import scipy.linalg as sla

from calcpad.core.errors import InputError
from calcpad.core.units import Q_
from calcpad.eng.analysis._values import to_float

__all__ = ["SUPPORT_KINDS", "Frame", "FrameResult", "MemberDiagram", "add_frame_results"]

#: Support kinds and the freedoms (ux, uy, rz) each one fixes.
SUPPORT_KINDS: dict[str, tuple[bool, bool, bool]] = {
    "fixed": (True, True, True),
    "pinned": (True, True, False),
    "roller": (False, True, False),  # on a horizontal surface: holds y, free in x
    "roller_y": (False, True, False),
    "roller_x": (True, False, False),  # against a vertical surface: holds x, free in y
    "guided": (True, False, True),
}
_DIR = ("x", "y", "rotation")
_LOAD_DIRS = ("x", "y", "local_x", "local_y")


@dataclass
class _Member:
    name: str
    i: str
    j: str
    E: float
    A: float
    I: float
    release_i: bool
    release_j: bool


@dataclass
class _Case:
    node: list[tuple[str, float, float, float]] = field(default_factory=list)
    udl: list[tuple[str, float, str]] = field(default_factory=list)
    point: list[tuple[str, float, float, str]] = field(default_factory=list)


@dataclass
class MemberDiagram:
    """Internal forces and displacements along one member for one case or combination.

    ``x`` is the distance from the start node; ``N``, ``V``, ``M`` the internal forces; ``u``/``v``
    the local axial/transverse displacements; ``delta_rel`` the transverse displacement measured
    from the chord between the displaced member ends; ``xg``/``yg`` the displaced global position
    (without magnification).
    """

    member: str
    case: str
    x: np.ndarray
    N: np.ndarray
    V: np.ndarray
    M: np.ndarray
    u: np.ndarray
    v: np.ndarray
    delta_rel: np.ndarray
    xg: np.ndarray
    yg: np.ndarray


class Frame:
    """A 2D frame model: nodes, members, supports, load cases and combinations.

    Args:
        force_unit: Unit of plain-number forces and of results (e.g. ``"kip"``, ``"kN"``).
        length_unit: Unit of plain-number lengths and of results (e.g. ``"in"``, ``"m"``).

    Example:
        >>> fr = Frame("kip", "in")
        >>> fr.node("A", 0, 0); fr.node("B", 0, "10 ft")
        >>> fr.member("AB", "A", "B", E="29000 ksi", A="3.0 in^2", I="10 in^4")
        >>> fr.support("A", "fixed")
        >>> fr.node_load("W", "B", Fx="1.2 kip")
        >>> res = fr.solve()
    """

    def __init__(self, force_unit: str = "kN", length_unit: str = "m") -> None:
        self.fu, self.lu = force_unit, length_unit
        try:
            Q_(1.0, force_unit).to("N")
            Q_(1.0, length_unit).to("m")
        except Exception:
            raise InputError(
                f"units: got force_unit={force_unit!r}, length_unit={length_unit!r}; expected e.g. 'kip', 'in'"
            ) from None
        self.nodes: dict[str, tuple[float, float]] = {}
        self.members: dict[str, _Member] = {}
        self.supports: dict[str, tuple[bool, bool, bool]] = {}
        self.cases: dict[str, _Case] = {}
        self.combos: dict[str, dict[str, float]] = {}

    # ---------------------------------------------------------------- model
    def _len(self, v: Any, field_name: str) -> float:
        return to_float(v, self.lu, field_name)

    def node(self, name: str, x: Any, y: Any) -> None:
        """Add node ``name`` at (x, y)."""
        if not isinstance(name, str) or not name:
            raise InputError(f"node name: got {name!r}; expected a non-empty text")
        if name in self.nodes:
            raise InputError(f"node {name!r}: already defined; expected a new name")
        self.nodes[name] = (self._len(x, f"node {name} x"), self._len(y, f"node {name} y"))

    def _need_node(self, name: str, what: str) -> None:
        if name not in self.nodes:
            raise InputError(f"{what}: node {name!r} not found; expected one of {list(self.nodes)}")

    def member(
        self,
        name: str,
        start: str,
        end: str,
        *,
        E: Any,
        A: Any,
        I: Any,
        release_start: bool = False,
        release_end: bool = False,
    ) -> None:
        """Add member ``name`` from node ``start`` to node ``end``.

        Args:
            E, A, I: Modulus, area and moment of inertia (values with units or plain numbers).
            release_start, release_end: Moment release (hinge) at that end of the member.
        """
        if name in self.members:
            raise InputError(f"member {name!r}: already defined; expected a new name")
        self._need_node(start, f"member {name} start")
        self._need_node(end, f"member {name} end")
        (x1, y1), (x2, y2) = self.nodes[start], self.nodes[end]
        if np.hypot(x2 - x1, y2 - y1) <= 1e-12 * max(1.0, abs(x1), abs(y1)):
            raise InputError(
                f"member {name}: nodes {start!r} and {end!r} are at the same point; expected a member of non-zero length"
            )
        e = to_float(E, f"{self.fu}/{self.lu}**2", f"member {name} E")
        a = to_float(A, f"{self.lu}**2", f"member {name} A")
        i = to_float(I, f"{self.lu}**4", f"member {name} I")
        for val, lab, raw in ((e, "E", E), (a, "A", A), (i, "I", I)):
            if val <= 0:
                raise InputError(f"member {name} {lab}: got {raw!r}; expected a value greater than zero")
        self.members[name] = _Member(name, start, end, e, a, i, bool(release_start), bool(release_end))

    def support(self, node: str, kind: str = "fixed") -> None:
        """Support ``node``: ``kind`` is one of :data:`SUPPORT_KINDS` (fixed, pinned, roller, ...)."""
        self._need_node(node, "support")
        if kind not in SUPPORT_KINDS:
            raise InputError(f"support at {node}: kind {kind!r}; expected one of {list(SUPPORT_KINDS)}")
        self.supports[node] = SUPPORT_KINDS[kind]

    def _case(self, case: str) -> _Case:
        if not isinstance(case, str) or not case:
            raise InputError(f"load case: got {case!r}; expected a name such as 'D' or 'W'")
        if case in self.combos:
            raise InputError(f"load case {case!r}: already used as a combination name")
        return self.cases.setdefault(case, _Case())

    def node_load(self, case: str, node: str, Fx: Any = 0.0, Fy: Any = 0.0, Mz: Any = 0.0) -> None:
        """Add a force (global x, y) and a moment (counter-clockwise) at ``node`` in ``case``."""
        self._need_node(node, f"node load in case {case!r}")
        c = self._case(case)
        c.node.append(
            (
                node,
                to_float(Fx, self.fu, f"node load {case}/{node} Fx"),
                to_float(Fy, self.fu, f"node load {case}/{node} Fy"),
                to_float(Mz, f"{self.fu}*{self.lu}", f"node load {case}/{node} Mz"),
            )
        )

    def _need_member(self, name: str, what: str) -> _Member:
        if name not in self.members:
            raise InputError(f"{what}: member {name!r} not found; expected one of {list(self.members)}")
        return self.members[name]

    @staticmethod
    def _direction(direction: str, what: str) -> str:
        if direction not in _LOAD_DIRS:
            raise InputError(f"{what}: direction {direction!r}; expected one of {_LOAD_DIRS}")
        return direction

    def member_load(self, case: str, member: str, w: Any, direction: str = "y") -> None:
        """Uniform load ``w`` (force per length of member) over the whole member.

        ``direction``: ``"y"``/``"x"`` global (gravity is negative ``y``) or ``"local_y"``/``"local_x"``.
        """
        self._need_member(member, f"member load in case {case!r}")
        d = self._direction(direction, f"member load {case}/{member}")
        self._case(case).udl.append((member, to_float(w, f"{self.fu}/{self.lu}", f"member load {case}/{member} w"), d))

    def member_point_load(self, case: str, member: str, P: Any, a: Any, direction: str = "y") -> None:
        """Point load ``P`` on ``member`` at distance ``a`` from its start node."""
        m = self._need_member(member, f"member point load in case {case!r}")
        d = self._direction(direction, f"member point load {case}/{member}")
        L = self._length(m)
        af = self._len(a, f"member point load {case}/{member} a")
        if not 0 <= af <= L:
            raise InputError(f"member point load {case}/{member} a: got {a!r}; expected 0 to the member length {L:g} {self.lu}")
        self._case(case).point.append((member, to_float(P, self.fu, f"member point load {case}/{member} P"), af, d))

    def combination(self, name: str, factors: dict[str, float]) -> None:
        """Define combination ``name`` = sum of factor * case (cases may be defined later)."""
        if name in self.cases or name in self.combos:
            raise InputError(f"combination {name!r}: name already used; expected a new name")
        if not factors:
            raise InputError(f"combination {name!r}: no factors; expected e.g. {{'D': 1.2, 'L': 1.6}}")
        out = {}
        for k, f in factors.items():
            if isinstance(f, bool) or not isinstance(f, (int, float)):
                raise InputError(f"combination {name!r}: factor for {k!r} is {f!r}; expected a number")
            out[k] = float(f)
        self.combos[name] = out

    # ---------------------------------------------------------------- mechanics
    def _length(self, m: _Member) -> float:
        (x1, y1), (x2, y2) = self.nodes[m.i], self.nodes[m.j]
        return float(np.hypot(x2 - x1, y2 - y1))

    def _geom(self, m: _Member) -> tuple[float, float, float]:
        (x1, y1), (x2, y2) = self.nodes[m.i], self.nodes[m.j]
        L = float(np.hypot(x2 - x1, y2 - y1))
        return L, (x2 - x1) / L, (y2 - y1) / L

    @staticmethod
    def _T(c: float, s: float) -> np.ndarray:
        r = np.array([[c, s, 0.0], [-s, c, 0.0], [0.0, 0.0, 1.0]])
        T = np.zeros((6, 6))
        T[:3, :3] = r
        T[3:, 3:] = r
        return T

    @staticmethod
    def _k_local(E: float, A: float, I: float, L: float) -> np.ndarray:
        a, b, c, d, e = E * A / L, 12 * E * I / L**3, 6 * E * I / L**2, 4 * E * I / L, 2 * E * I / L
        return np.array(
            [
                [a, 0, 0, -a, 0, 0],
                [0, b, c, 0, -b, c],
                [0, c, d, 0, -c, e],
                [-a, 0, 0, a, 0, 0],
                [0, -b, -c, 0, b, -c],
                [0, c, e, 0, -c, d],
            ]
        )

    @staticmethod
    def _released(m: _Member) -> list[int]:
        return ([2] if m.release_i else []) + ([5] if m.release_j else [])

    def _local_loads(self, m: _Member, c: float, s: float, case: _Case) -> tuple[list, list]:
        """Member loads of one case in local components: ([(qx, qy)], [(Px, Py, a)])."""
        udl, pts = [], []
        for name, w, d in case.udl:
            if name != m.name:
                continue
            gx, gy = {"x": (w, 0.0), "y": (0.0, w)}.get(d, (0.0, 0.0))
            if d.startswith("local"):
                udl.append((w, 0.0) if d == "local_x" else (0.0, w))
            else:
                udl.append((c * gx + s * gy, -s * gx + c * gy))
        for name, P, a, d in case.point:
            if name != m.name:
                continue
            gx, gy = {"x": (P, 0.0), "y": (0.0, P)}.get(d, (0.0, 0.0))
            if d.startswith("local"):
                pts.append(((P, 0.0) if d == "local_x" else (0.0, P)) + (a,))
            else:
                pts.append((c * gx + s * gy, -s * gx + c * gy, a))
        return udl, pts

    @staticmethod
    def _fixed_end(L: float, udl: list, pts: list) -> np.ndarray:
        """Local fixed-end forces (on the member from the nodes) for the member loads."""
        f = np.zeros(6)
        for qx, qy in udl:
            f += [-qx * L / 2, -qy * L / 2, -qy * L**2 / 12, -qx * L / 2, -qy * L / 2, qy * L**2 / 12]
        for px, py, a in pts:
            b = L - a
            f += [
                -px * b / L,
                -py * b**2 * (3 * a + b) / L**3,
                -py * a * b**2 / L**2,
                -px * a / L,
                -py * a**2 * (a + 3 * b) / L**3,
                py * a**2 * b / L**2,
            ]
        return f

    def solve(self) -> FrameResult:
        """Assemble, check stability, solve every load case and combination.

        Raises:
            InputError: No members, no load cases, an unknown case in a combination, a moment on a
                node that cannot take one, or an unstable frame (the message names the free
                nodes and directions, and the supports or releases to look at).
        """
        if not self.members:
            raise InputError("frame: no members; expected at least one member")
        if not self.cases:
            raise InputError("frame: no loads; expected at least one load case")
        for cname, fac in self.combos.items():
            for k in fac:
                if k not in self.cases:
                    raise InputError(f"combination {cname!r}: load case {k!r} not found; expected one of {list(self.cases)}")
        names = list(self.nodes)
        index = {n: i for i, n in enumerate(names)}
        used = {m.i for m in self.members.values()} | {m.j for m in self.members.values()}
        for n in names:
            if n not in used:
                raise InputError(f"node {n!r}: not connected to any member; expected every node on a member")
        nd = 3 * len(names)
        case_names = list(self.cases)
        nc = len(case_names)
        K = np.zeros((nd, nd))
        P = np.zeros((nd, nc))
        elem: dict[str, dict[str, Any]] = {}
        for m in self.members.values():
            L, c, s = self._geom(m)
            T = self._T(c, s)
            k = self._k_local(m.E, m.A, m.I, L)
            rel = self._released(m)
            keep = [q for q in range(6) if q not in rel]
            f0 = np.zeros((6, nc))
            loads = []
            for ci, cn in enumerate(case_names):
                udl, pts = self._local_loads(m, c, s, self.cases[cn])
                loads.append((udl, pts))
                f0[:, ci] = self._fixed_end(L, udl, pts)
            kc = np.zeros((6, 6))
            f0c = f0.copy()
            cond = None
            if rel:
                krr = k[np.ix_(rel, rel)]
                kkr = k[np.ix_(keep, rel)]
                G = np.linalg.solve(krr, kkr.T)  # krr^-1 k_rk
                kc[np.ix_(keep, keep)] = k[np.ix_(keep, keep)] - kkr @ G
                f0c[keep] = f0[keep] - kkr @ np.linalg.solve(krr, f0[rel])
                f0c[rel] = 0.0
                cond = (rel, keep, krr, k[np.ix_(rel, keep)])
            else:
                kc = k
            dofs = [3 * index[m.i] + q for q in range(3)] + [3 * index[m.j] + q for q in range(3)]
            K[np.ix_(dofs, dofs)] += T.T @ kc @ T
            P[dofs] -= T.T @ f0c
            elem[m.name] = {"L": L, "c": c, "s": s, "T": T, "kc": kc, "f0": f0, "f0c": f0c, "dofs": dofs,
                            "loads": loads, "cond": cond}
        for ci, cn in enumerate(case_names):
            for n, fx, fy, mz in self.cases[cn].node:
                P[3 * index[n]: 3 * index[n] + 3, ci] += [fx, fy, mz]
        fixed = np.zeros(nd, dtype=bool)
        for n, r in self.supports.items():
            fixed[3 * index[n]: 3 * index[n] + 3] = r
        # rotations no member can resist (every member released there): hold them, no moment allowed
        idle = [q for q in range(2, nd, 3) if not fixed[q] and abs(K[q, q]) == 0.0]
        for q in idle:
            if np.any(P[q] != 0):
                n = names[q // 3]
                raise InputError(
                    f"node load at {n!r}: a moment is applied but every member end at {n!r} is released "
                    "and the node has no rotational support; expected no moment there, or a member fixed to the node"
                )
            fixed[q] = True
        free = np.flatnonzero(~fixed)
        U = np.zeros((nd, nc))
        Kff = K[np.ix_(free, free)]
        if free.size:
            self._check_stable(Kff, free, names, fixed)
        try:
            if free.size:
                U[free] = sla.cho_solve(sla.cho_factor(Kff), P[free])
        except np.linalg.LinAlgError:  # not positive definite to round-off: fall back to LU
            U[free] = sla.lu_solve(sla.lu_factor(Kff), P[free])
        R = K @ U - P
        R[~fixed] = 0.0
        for q in idle:
            R[q] = 0.0
        return FrameResult(self, names, case_names, U, R, elem)

    def _check_stable(self, Kff: np.ndarray, free: np.ndarray, names: list[str], fixed: np.ndarray) -> None:
        d = np.sqrt(np.abs(np.diag(Kff)))
        bad_diag = np.flatnonzero(d == 0)
        if bad_diag.size:
            lab = [f"{names[free[q] // 3]} ({_DIR[free[q] % 3]})" for q in bad_diag]
            raise InputError(f"frame is unstable: no member or support resists {', '.join(lab)}; expected a support or member there")
        S = Kff / np.outer(d, d)
        w, Vec = np.linalg.eigh(S)
        zero = w < 1e-10 * max(w.max(), 1.0)
        if not zero.any():
            return
        msgs = []
        # rigid-body motions the supports leave free
        nd = fixed.size
        rigid = np.zeros((nd, 3))
        for k, n in enumerate(names):
            x, y = self.nodes[n]
            rigid[3 * k: 3 * k + 3, 0] = [1, 0, 0]
            rigid[3 * k: 3 * k + 3, 1] = [0, 1, 0]
            rigid[3 * k: 3 * k + 3, 2] = [-y, x, 1]
        Rr = rigid[fixed]
        if not np.any(Rr[:, 0]):
            msgs.append("no support holds the frame in x (add a pinned or fixed support, or a roller_x)")
        if not np.any(Rr[:, 1]):
            msgs.append("no support holds the frame in y (add a pinned, fixed or roller support)")
        if not msgs and np.linalg.matrix_rank(Rr, tol=1e-9 * max(1.0, np.abs(Rr).max())) < 3:
            msgs.append("the supports cannot stop the frame rotating (fix a support, or add a second support off the line of the others)")
        modes = Vec[:, zero]
        movers: list[str] = []
        for k in range(modes.shape[1]):
            z = modes[:, k]
            big = np.flatnonzero(np.abs(z) > 0.2 * np.abs(z).max())
            for q in big:
                lab = f"{names[free[q] // 3]} ({_DIR[free[q] % 3]})"
                if lab not in movers:
                    movers.append(lab)
        nodes_moving = {m.split(" ")[0] for m in movers}
        rels = [
            f"{m.name} at {m.i if end == 'start' else m.j}"
            for m in self.members.values()
            for end, flag in (("start", m.release_i), ("end", m.release_j))
            if flag and (m.i if end == "start" else m.j) in nodes_moving
        ]
        text = "frame is unstable (a mechanism): " + ("; ".join(msgs) + "; " if msgs else "")
        text += f"it can move without straining at {', '.join(movers[:12])}"
        if rels:
            text += f"; member end releases involved: {', '.join(rels)}"
        text += "; expected enough supports and fixed member ends to hold every node"
        raise InputError(text)


class FrameResult:
    """Results of :meth:`Frame.solve` for every load case and combination.

    Raw arrays (floats in the frame units): ``U`` and ``R`` (3 per node x results),
    ``end_forces_local[member]`` (6 x results, forces on the member from the nodes, local axes).
    Accessors return pint quantities; ``*_frame`` methods return pandas tables for ``sh.table``.
    """

    def __init__(self, frame: Frame, nodes: list[str], cases: list[str], U: np.ndarray, R: np.ndarray,
                 elem: dict[str, dict[str, Any]]) -> None:
        self.frame = frame
        self.nodes = nodes
        self.units = {"force": frame.fu, "length": frame.lu, "moment": f"{frame.fu}*{frame.lu}"}
        self._idx = {n: i for i, n in enumerate(nodes)}
        combos = frame.combos
        C = np.zeros((len(cases), len(combos)))
        for j, fac in enumerate(combos.values()):
            for k, f in fac.items():
                C[cases.index(k), j] = f
        self.case_names = list(cases)
        self.names = list(cases) + list(combos)
        self._factors = np.hstack([np.eye(len(cases)), C])  # cases x results
        self.U = U @ self._factors
        self.R = R @ self._factors
        self._elem = elem
        self.end_forces_local: dict[str, np.ndarray] = {}
        for name, e in elem.items():
            T, kc = e["T"], e["kc"]
            u = T @ self.U[e["dofs"]]
            self.end_forces_local[name] = kc @ u + e["f0c"] @ self._factors

    # ---------------------------------------------------------------- lookups
    def direction(self, member: str) -> tuple[float, float]:
        """Direction cosines ``(cos, sin)`` of ``member``'s local x axis."""
        if member not in self._elem:
            raise InputError(f"result: member {member!r} not found; expected one of {list(self._elem)}")
        return self._elem[member]["c"], self._elem[member]["s"]

    def _col(self, case: str) -> int:
        if case not in self.names:
            raise InputError(f"result: case {case!r} not found; expected one of {self.names}")
        return self.names.index(case)

    def _node(self, node: str) -> int:
        if node not in self._idx:
            raise InputError(f"result: node {node!r} not found; expected one of {self.nodes}")
        return self._idx[node]

    def displacement(self, node: str, case: str) -> tuple[pint.Quantity, pint.Quantity, pint.Quantity]:
        """(ux, uy, rotation) of ``node`` for ``case``."""
        i, c = self._node(node), self._col(case)
        ux, uy, rz = self.U[3 * i: 3 * i + 3, c]
        return Q_(ux, self.units["length"]), Q_(uy, self.units["length"]), Q_(rz, "radian")

    def reaction(self, node: str, case: str) -> tuple[pint.Quantity, pint.Quantity, pint.Quantity]:
        """(Rx, Ry, Mz) support reactions at ``node`` for ``case`` (global axes, moment counter-clockwise)."""
        i, c = self._node(node), self._col(case)
        rx, ry, mz = self.R[3 * i: 3 * i + 3, c]
        return Q_(rx, self.units["force"]), Q_(ry, self.units["force"]), Q_(mz, self.units["moment"])

    def member_loads(self, member: str, case: str) -> tuple[list, list]:
        """Local member loads of ``case`` (combinations: factored sums): ([(qx, qy, f)], [(Px, Py, a, f)])."""
        e = self._elem[member]
        col = self._factors[:, self._col(case)]
        udl, pts = [], []
        for ci, (u, p) in enumerate(e["loads"]):
            if col[ci] == 0:
                continue
            udl += [(qx * col[ci], qy * col[ci]) for qx, qy in u]
            pts += [(px * col[ci], py * col[ci], a) for px, py, a in p]
        return udl, pts

    def diagram(self, member: str, case: str, n: int = 41) -> MemberDiagram:
        """N, V, M and displacements along ``member`` for ``case`` (``n`` stations + load points)."""
        if member not in self._elem:
            raise InputError(f"result: member {member!r} not found; expected one of {list(self._elem)}")
        e = self._elem[member]
        m = self.frame.members[member]
        col = self._col(case)
        L = e["L"]
        udl, pts = self.member_loads(member, case)
        xs = np.linspace(0.0, L, max(int(n), 2))
        if pts:
            a_s = np.array([a for _, _, a in pts])
            xs = np.union1d(xs, np.concatenate([a_s, np.clip(a_s - 1e-9 * L, 0, L), np.clip(a_s + 1e-9 * L, 0, L)]))
        f = self.end_forces_local[member][:, col]
        Fx1, Fy1, M1 = f[0], f[1], f[2]
        N = -Fx1 + 0 * xs
        V = Fy1 + 0 * xs
        M = -M1 + Fy1 * xs
        for qx, qy in udl:
            N -= qx * xs
            V += qy * xs
            M += qy * xs**2 / 2
        for px, py, a in pts:
            H = (xs > a).astype(float)
            N -= px * H
            V += py * H
            M += py * (xs - a) * H
        # displacements: end values (with released-end rotations recovered) + fixed-end particular parts
        d = e["T"] @ self.U[e["dofs"], col]
        if e["cond"] is not None:
            rel, keep, krr, krk = e["cond"]
            f0r = (e["f0"] @ self._factors[:, col])[rel]
            d = d.copy()
            d[rel] = -np.linalg.solve(krr, krk @ d[keep] + f0r)
        t = xs / L
        h1, h2 = 1 - 3 * t**2 + 2 * t**3, L * (t - 2 * t**2 + t**3)
        h3, h4 = 3 * t**2 - 2 * t**3, L * (t**3 - t**2)
        v = h1 * d[1] + h2 * d[2] + h3 * d[4] + h4 * d[5]
        u = (1 - t) * d[0] + t * d[3]
        EI, EA = m.E * m.I, m.E * m.A
        for qx, qy in udl:
            v += qy * xs**2 * (L - xs) ** 2 / (24 * EI)
            u += qx * xs * (L - xs) / (2 * EA)
        for px, py, a in pts:
            b = L - a
            left = xs <= a
            xr = L - xs
            v += np.where(
                left,
                py * b**2 * xs**2 * (3 * a * L - (3 * a + b) * xs) / (6 * EI * L**3),
                py * a**2 * xr**2 * (3 * b * L - (3 * b + a) * xr) / (6 * EI * L**3),
            )
            u += np.where(left, px * b * xs / (EA * L), px * a * xr / (EA * L))
        delta_rel = v - ((1 - t) * d[1] + t * d[4])
        c, s = e["c"], e["s"]
        x0, y0 = self.frame.nodes[m.i]
        xg = x0 + c * (xs + u) - s * v
        yg = y0 + s * (xs + u) + c * v
        return MemberDiagram(member, case, xs, N, V, M, u, v, delta_rel, xg, yg)

    def end_forces(self, member: str, case: str) -> dict[str, pint.Quantity]:
        """Internal forces at both member ends: ``N_start, V_start, M_start, N_end, V_end, M_end``."""
        dg = self.diagram(member, case, n=2)
        fu, mu = self.units["force"], self.units["moment"]
        return {
            "N_start": Q_(dg.N[0], fu), "V_start": Q_(dg.V[0], fu), "M_start": Q_(dg.M[0], mu),
            "N_end": Q_(dg.N[-1], fu), "V_end": Q_(dg.V[-1], fu), "M_end": Q_(dg.M[-1], mu),
        }

    def envelope(self, member: str, quantity: str = "M", cases: list[str] | None = None,
                 n: int = 41) -> tuple[pint.Quantity, str, pint.Quantity]:
        """Largest magnitude of ``quantity`` (``N``, ``V``, ``M`` or ``delta_rel``) along ``member``
        over ``cases`` (default: every case and combination): (value with sign, case, location)."""
        if quantity not in ("N", "V", "M", "delta_rel"):
            raise InputError(f"quantity: got {quantity!r}; expected 'N', 'V', 'M' or 'delta_rel'")
        best = (0.0, "", 0.0)
        for cn in cases or self.names:
            dg = self.diagram(member, cn, n)
            arr = getattr(dg, quantity)
            k = int(np.argmax(np.abs(arr)))
            if abs(arr[k]) > abs(best[0]) or not best[1]:
                best = (float(arr[k]), cn, float(dg.x[k]))
        unit = {"N": self.units["force"], "V": self.units["force"], "M": self.units["moment"],
                "delta_rel": self.units["length"]}[quantity]
        return Q_(best[0], unit), best[1], Q_(best[2], self.units["length"])

    # ---------------------------------------------------------------- tables
    def reactions_frame(self, cases: list[str] | None = None) -> Any:
        """Table of support reactions (rows: support x case)."""
        import pandas as pd

        fu, mu = self.units["force"], self.units["moment"]
        rows = []
        for cn in cases or self.names:
            c = self._col(cn)
            for n in self.frame.supports:
                i = self._idx[n]
                rx, ry, mz = self.R[3 * i: 3 * i + 3, c]
                rows.append({"case": cn, "node": n, f"Rx [{fu}]": rx, f"Ry [{fu}]": ry, f"Mz [{_shown(mu)}]": mz})
        return pd.DataFrame(rows)

    def member_forces_frame(self, cases: list[str] | None = None, members: list[str] | None = None) -> Any:
        """Table of member end forces (N, V, M at start and end; internal-force signs)."""
        import pandas as pd

        fu, mu = self.units["force"], self.units["moment"]
        for mname in members or []:
            if mname not in self.frame.members:
                raise InputError(f"members: {mname!r} not found; expected some of {list(self.frame.members)}")
        rows = []
        for cn in cases or self.names:
            for mname in members or self.frame.members:
                dg = self.diagram(mname, cn, n=2)
                rows.append({
                    "case": cn, "member": mname,
                    f"N start [{fu}]": dg.N[0], f"V start [{fu}]": dg.V[0], f"M start [{_shown(mu)}]": dg.M[0],
                    f"N end [{fu}]": dg.N[-1], f"V end [{fu}]": dg.V[-1], f"M end [{_shown(mu)}]": dg.M[-1],
                })
        return pd.DataFrame(rows)

    def displacements_frame(self, cases: list[str] | None = None) -> Any:
        """Table of node displacements (ux, uy in length units, rotation in rad)."""
        import pandas as pd

        lu = self.units["length"]
        rows = []
        for cn in cases or self.names:
            c = self._col(cn)
            for n, i in self._idx.items():
                ux, uy, rz = self.U[3 * i: 3 * i + 3, c]
                rows.append({"case": cn, "node": n, f"ux [{lu}]": ux, f"uy [{lu}]": uy, "rz [rad]": rz})
        return pd.DataFrame(rows)


def add_frame_results(
    sh: Any,
    result: FrameResult,
    cases: list[str] | None = None,
    *,
    title: str = "Frame analysis",
    figure_case: str | None = None,
    moment_diagram: bool = True,
    members: list[str] | None = None,
) -> None:
    """Put frame results into sheet ``sh``: a heading, the model drawing (with the loads and the
    deflected shape of ``figure_case``), reaction and member-end-force tables for ``cases``
    (default: all; member forces for ``members``, default all) and, optionally, the moment
    diagram of ``figure_case``."""
    from calcpad.eng.analysis.diagrams import draw_frame, draw_frame_diagram, drawing_png

    case = figure_case or (cases or result.names)[0]
    sh.heading(title, level=2)
    sh.figure(f"Frame model, loads and deflected shape ({case})", drawing_png(draw_frame, result.frame, result, case))
    sh.table("Support reactions (global axes; moment counter-clockwise +)", result.reactions_frame(cases))
    sh.table("Member end forces (N tension +, M sagging +)", result.member_forces_frame(cases, members))
    if moment_diagram:
        sh.figure(f"Bending moment diagram ({case})", drawing_png(draw_frame_diagram, result, case, "M", members=members))


def _shown(unit: str) -> str:
    """A unit as a table heading shows it: ``lbf*in`` → ``lbf·in``."""
    return unit.replace("*", "·")
