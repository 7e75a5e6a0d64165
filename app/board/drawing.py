"""The drawing of one body on the board: hulls, marks, fittings, tugs and the balance.

All of it is drawn in the body frame (x forward, y to port, m) as children of one
root item that the body's pose places in the site frame. Items are made once and
updated in place, so a drag only moves what changed.
"""

from __future__ import annotations

import math
from collections.abc import Callable

import shapely
from PySide6.QtCore import QLineF, QPointF, QRectF, Qt
from PySide6.QtGui import QPainterPath, QPolygonF
from PySide6.QtWidgets import QGraphicsItem, QGraphicsScene

from app.board.cache import still_mode
from app.board.items import (
    FIXED_CACHE,
    GUIDE,
    NO_CACHE,
    ROLE,
    Arrow,
    FittingMark,
    Handle,
    Label,
    LineItem,
    Mark,
    MomentArrow,
    PathItem,
    PiecedLine,
    TugItem,
    polygon_path,
    take_out,
)
from app.formatting import fitting_summary, signed
from app.guard import guarded
from app.paint import style
from app.paint.shapes import TUG_LENGTH_M, moment_arc, placed_tug, tug_label_anchor, tug_origin
from app.paint.symbols import polygon
from core.mechanics.balance import Balance, TugShare
from core.mechanics.bodies import Body, Member
from core.model.hull import Hull
from core.model.plan import BodyPose
from core.units import DisplayUnits

Z_HULL, Z_LINE, Z_TUG, Z_FORCE, Z_BALANCE, Z_FITTING, Z_LABEL, Z_HANDLE = 0, 2, 3, 5, 6, 7, 10, 11


class Root(QGraphicsItem):
    """An empty item that carries a frame (a body's pose, a member's pose in its body)."""

    def __init__(self, parent: QGraphicsItem | None = None) -> None:
        super().__init__(parent)
        self.setFlag(QGraphicsItem.GraphicsItemFlag.ItemHasNoContents)

    @guarded(default=QRectF)
    def boundingRect(self) -> QRectF:
        return QRectF()

    @guarded
    def paint(self, *args: object) -> None:
        return


def _screen_angle(root: QGraphicsItem, v: tuple[float, float]) -> float:
    """Screen angle (deg, clockwise, y down) of a direction ``v`` given in ``root``'s frame."""
    t = root.sceneTransform()
    sx = t.m11() * v[0] + t.m21() * v[1]
    sy = t.m12() * v[0] + t.m22() * v[1]
    return -math.degrees(math.atan2(sy, sx))  # the view flips y so north is up


class Changes:
    """A count of the changes to a body's still drawings (its hulls, its tugs, the loads),
    shared by them: a tug drag's backdrop (app.board.backdrop) reads it on every move."""

    __slots__ = ("count",)

    def __init__(self) -> None:
        self.count = 0


class HullDrawing:
    """One hull: outline, centreline, bow/stern and side marks, fittings, vertex handles."""

    def __init__(self, root: Root, member: Member, changes: Changes | None = None) -> None:
        self.changes = changes or Changes()
        self.frame = Root(root)
        self.hull: Hull | None = None
        self.outline = PathItem(self.frame)
        self.outline.setZValue(Z_HULL)
        self.outline.setBrush(style.HULL_FILL)
        self.outline.setPen(style.pen(style.HULL_EDGE, 1.6))
        self.invalid = PathItem(self.frame)
        self.invalid.setZValue(Z_HULL + 1)
        self.invalid.setPen(style.pen(style.INVALID, 2.0, Qt.PenStyle.DashLine))
        self.invalid.setBrush(style.INVALID_FILL)
        self.invalid.setVisible(False)
        self.centreline = LineItem(self.frame)
        self.centreline.setZValue(Z_HULL + 1)
        self.centreline.setPen(style.pen(style.CENTRELINE, 1.0, Qt.PenStyle.DashDotLine))
        self.port_side = LineItem(self.frame)
        self.port_side.setPen(style.pen(style.PORT, 4.0))
        self.stbd_side = LineItem(self.frame)
        self.stbd_side.setPen(style.pen(style.STARBOARD, 4.0))
        for line in (self.port_side, self.stbd_side, self.centreline):
            line.setZValue(Z_HULL + 1)
        #: The items drawn in the hull's frame from a device cache while it lies unturned.
        self.cached = (self.outline, self.port_side, self.stbd_side, self.centreline)
        bold = style.label_font(8.5, bold=True)
        self.bow = Label("BOW", self.frame, style.HULL_EDGE, bold, (0, 0), "centre")
        self.stern = Label("STERN", self.frame, style.HULL_EDGE, bold, (0, 0), "centre")
        self.port = Label("PORT", self.frame, style.PORT, bold, (0, 0), "centre")
        self.stbd = Label("STBD", self.frame, style.STARBOARD, bold, (0, 0), "centre")
        self.name = Label(
            "", self.frame, style.HULL_EDGE, style.label_font(9.5, True), (0, 0), "centre"
        )
        for item in (self.bow, self.stern, self.port, self.stbd, self.name):
            item.setZValue(Z_LABEL)
        for item in (self.bow, self.stern, self.name):
            item.on_hull = True  # they name the hull: on it is their place
            item.priority = 6
        self.port.priority = self.stbd.priority = 5
        self.reference = Mark("reference", self.frame, 10)
        self.reference.setZValue(Z_FITTING)
        self.reference.setToolTip("Reference point: the hull frame's origin")
        self.fittings: dict[str, tuple[FittingMark, Label]] = {}
        self.handles: list[Handle] = []
        self.units = DisplayUnits()
        #: The selection last shown (reset when handles or fittings are made again).
        self._selection_shown: object = None
        #: Counts the changes to this hull's items (so does ``changes``, with the others').
        self.revision = 0
        self.set_member(member)

    def _changed(self) -> None:
        self.revision += 1
        self.changes.count += 1

    def set_member(self, member: Member) -> None:
        self._changed()
        self.frame.setPos(member.x, member.y)
        self.frame.setRotation(math.degrees(member.heading_rad))
        self.fit_cache()
        self.outline.setData(ROLE, ("hull", member.hull.name))
        if member.hull is not self.hull:
            self.set_hull(member.hull)

    def fit_cache(self) -> None:
        """Cache the hull's pictures as it lies on screen now (see app.board.cache)."""
        for item in self.cached:
            item.setCacheMode(still_mode(item))

    def set_hull(self, hull: Hull) -> None:
        self._changed()
        old = self.hull
        self.hull = hull
        if old is None or old.outline != hull.outline:
            self.outline.setPath(polygon_path(hull.outline))
            self._place_marks(hull)
            self._sync_handles(hull)
        if old is None or old.fittings != hull.fittings:
            self._sync_fittings(hull)
        self.name.set_text(hull.name)

    def set_units(self, units: DisplayUnits) -> None:
        """Write the fittings' tooltips again when the display units change."""
        if units == self.units:
            return
        self._changed()
        self.units = units
        if self.hull is not None:
            for f in self.hull.fittings:
                self.fittings[f.name][0].setToolTip(fitting_summary(units, f))

    def _place_marks(self, hull: Hull) -> None:
        g = hull.geometry
        ys = [y for _, y in hull.outline]
        y_port, y_stbd = max(ys), min(ys)
        pad = 0.06 * max(g.length, 1.0)
        self.centreline.setLine(QLineF(g.x_min - pad, 0.0, g.x_max + pad, 0.0))
        self.bow.setPos(g.x_max - 1.2 * pad, 0.0)
        self.stern.setPos(g.x_min - 1.1 * pad, 0.0)
        # side marks along the middle of each side, just outside the outline
        x0, x1 = g.x_min + 0.35 * g.length, g.x_min + 0.65 * g.length
        gap = 0.012 * g.length
        self.port_side.setLine(QLineF(x0, y_port + gap, x1, y_port + gap))
        self.stbd_side.setLine(QLineF(x0, y_stbd - gap, x1, y_stbd - gap))
        self.port.setPos(g.x_min + 0.5 * g.length, y_port + gap)
        self.stbd.setPos(g.x_min + 0.5 * g.length, y_stbd - gap)
        self._aim_side_labels()
        self.name.setPos(g.x_min + 0.75 * g.length, 0.45 * y_port)

    def _sync_handles(self, hull: Hull) -> None:
        self._selection_shown = None
        n = len(hull.outline)
        while len(self.handles) > n:
            h = self.handles.pop()
            take_out(h)
        while len(self.handles) < n:
            h = Handle(self.frame)
            h.setZValue(Z_HANDLE)
            h.setVisible(self.outline.isSelected())
            self.handles.append(h)
        for i, (h, (x, y)) in enumerate(zip(self.handles, hull.outline, strict=True)):
            h.setPos(x, y)
            h.setData(ROLE, ("vertex", hull.name, i))

    def show_handles(self, on: bool, selected: int | None = None) -> None:
        self._changed()
        for i, h in enumerate(self.handles):
            h.setVisible(on)
            h.set_selected(i == selected)

    def _sync_fittings(self, hull: Hull) -> None:
        self._selection_shown = None
        names = {f.name for f in hull.fittings}
        for name in list(self.fittings):
            if name not in names:
                mark, lab = self.fittings.pop(name)
                for item in (mark, lab):
                    take_out(item)
        for f in hull.fittings:
            if f.name not in self.fittings or self.fittings[f.name][0].kind != f.kind:
                if f.name in self.fittings:
                    for item in self.fittings.pop(f.name):
                        take_out(item)
                mark = FittingMark(f.kind, self.frame)
                mark.setZValue(Z_FITTING)
                lab = Label("", self.frame, style.LINE_POINT, style.label_font(8), (9, 12))
                lab.setZValue(Z_LABEL)
                lab.priority = 3
                lab.setVisible(False)
                self.fittings[f.name] = (mark, lab)
            mark, lab = self.fittings[f.name]
            mark.setPos(f.x, f.y)
            mark.setData(ROLE, ("fitting", hull.name, f.name))
            mark.setToolTip(fitting_summary(self.units, f))
            lab.setPos(f.x, f.y)
            lab.set_text(f.name)
            q = hull.geometry.nearest(f.x, f.y)
            mark.angle_deg = _screen_angle(self.frame, (-q.normal[1], q.normal[0]))

    def hide_inner_sides(self, body: Body, member: Member) -> None:
        """In a lashed group, a side that lies against another hull gets no side mark."""
        if self.hull is None or len(body.members) < 2:
            return
        self._changed()
        g = self.hull.geometry
        ys = [y for _, y in self.hull.outline]
        out = 0.02 * g.length + 1.0
        mid = g.x_min + 0.5 * g.length
        for y, items in (
            (max(ys) + out, (self.port, self.port_side)),
            (min(ys) - out, (self.stbd, self.stbd_side)),
        ):
            bx, by = member.to_body((mid, y))
            inner = bool(shapely.contains_xy(body.polygon, bx, by))
            for item in items:
                item.setVisible(not inner)

    def _aim_side_labels(self) -> None:
        # PORT and STBD sit just outside their side, whichever way the body lies on screen
        a = math.radians(_screen_angle(self.frame, (0.0, 1.0)))
        ux, uy = math.cos(a), math.sin(a)  # port's direction on screen (y down)
        self.port.set_outward(ux, uy)
        self.stbd.set_outward(-ux, -uy)

    def refresh_screen_angles(self) -> None:
        """Re-aim the push pads after the body turned (their bar follows the hull edge)."""
        if self.hull is None:
            return
        self._changed()
        self._aim_side_labels()
        for f in self.hull.fittings:
            mark, _ = self.fittings[f.name]
            q = self.hull.geometry.nearest(f.x, f.y)
            mark.angle_deg = _screen_angle(self.frame, (-q.normal[1], q.normal[0]))
            mark.update()

    def set_selection(self, selection: tuple[object, ...] | None) -> None:
        key = (selection, self.hull.name if self.hull else None)
        if key == self._selection_shown:
            return  # a refresh in a drag: an outline's pen set again repaints the whole hull
        self._changed()
        self._selection_shown = key
        name = self.hull.name if self.hull else None
        hull_selected = bool(
            selection and selection[1] == name and selection[0] in ("hull", "vertex")
        )
        self.outline.setPen(
            style.pen(
                style.HULL_SELECTED if hull_selected else style.HULL_EDGE,
                2.4 if hull_selected else 1.6,
            )
        )
        vertex = (
            selection[2]
            if selection and selection[0] == "vertex" and selection[1] == name
            else None
        )
        self.show_handles(hull_selected, vertex)  # type: ignore[arg-type]
        for fname, (mark, lab) in self.fittings.items():
            on = bool(selection and selection[0] == "fitting" and selection[1:] == (name, fname))
            mark.set_selected(on)
            lab.setVisible(on)

    def show_invalid(self, outline: list[tuple[float, float]] | None) -> None:
        self._changed()
        if outline is None:
            self.invalid.setVisible(False)
            return
        path = QPainterPath()
        path.addPolygon(QPolygonF([QPointF(x, y) for x, y in outline]))
        path.closeSubpath()
        self.invalid.setPath(path)
        self.invalid.setVisible(True)


class TugDrawing:
    """One tug: its shape where it works, the towline, the force arrow (one item) and a label."""

    def __init__(self, root: Root, name: str, changes: Changes | None = None) -> None:
        self.changes = changes or Changes()
        self.name = name
        self._root = root  # the labels' side on screen is worked out in its frame
        self.glyph = TugItem(root)
        self.glyph.setZValue(Z_TUG)
        self.glyph.setData(ROLE, ("tug", name))
        self.glyph.setCacheMode(still_mode(self.glyph))  # a drag redraws only the tug that moves
        self.label = Label("", root, style.TEXT, style.label_font(8.5), (0, 0), "centre")
        self.label.setZValue(Z_LABEL)
        self.label.priority = 1
        self._key: tuple[object, ...] | None = None
        self._share: TugShare | None = None  # the share last drawn, and what else it took
        self._inputs: tuple[object, ...] | None = None
        self._placed: tuple[object, ...] | None = None  # the shape's origin and direction
        self._glyph = QPolygonF()
        self._selected = False
        self._dragging = False
        #: Counts the changes to this tug's items (so does ``changes``, with the others').
        self.revision = 0

    def _changed(self) -> None:
        self.revision += 1
        self.changes.count += 1

    def remove(self) -> None:
        self.changes.count += 1
        for item in (self.glyph, self.label):
            take_out(item)

    def forget(self) -> None:
        """Draw this tug again at its next update (its label's words changed)."""
        self._key = self._share = self._inputs = None
        self._changed()

    def update(
        self,
        share: TugShare,
        point: tuple[float, float],
        direction: tuple[float, float],
        force_scale: float,
        head: float,
        text: Callable[[TugShare], str],
        moving: bool = False,
    ) -> None:
        """Draw the tug's share; ``moving``: a drag is under way (a pull that changes
        alone is drawn apart from the rest, see TugItem)."""
        if not moving and self.glyph.join():
            self._changed()
        inputs = (point, direction, force_scale, head)
        if share is self._share and inputs == self._inputs:
            return  # the very share as before (a drag keeps the other tugs' shares)
        self._share, self._inputs = share, inputs
        key = (share.position, share.pull_n, share.setting, share.mode, inputs)
        if key == self._key:
            return  # nothing about this tug changed (the drag moves one tug at a time)
        self._key = key
        self._changed()
        dx, dy = direction
        towline = None
        if share.mode == "line":
            tx, ty = share.position
            towline = QLineF(point[0], point[1], tx, ty)
        # on a line the tug lies along it, stern to the hull; pushing, its bow on the point
        origin = tug_origin(share.mode, point, share.position, direction)
        if (origin, direction) != self._placed:  # else the same shape (a pull changed)
            self._placed = (origin, direction)
            self._glyph = polygon(placed_tug(origin, direction))
        glyph = self._glyph
        # the force arrow starts where the force acts on the hull and points along it
        length = share.pull_n * force_scale
        arrow = (point, (point[0] + dx * length, point[1] + dy * length)) if length > 1e-6 else None
        self.glyph.set_geometry(towline, glyph, arrow, head, apart=moving)
        # the label sits just beyond the tug's far end, away from the hull
        lx, ly = tug_label_anchor(share.mode, origin, direction, gap=0.0)
        self.label.setPos(lx, ly)
        self.label.set_text(text(share))
        away = direction if share.mode == "line" else (-dx, -dy)
        a = math.radians(_screen_angle(self._root, away))
        self.label.set_outward(math.cos(a), math.sin(a), 4.0)

    def set_dragging(self, on: bool) -> None:
        """While dragged, the tug is drawn directly: a pixmap cache would be remade every move."""
        self._changed()
        self._dragging = on
        self.glyph.setCacheMode(NO_CACHE if on else still_mode(self.glyph))
        self.label.setCacheMode(NO_CACHE if on else FIXED_CACHE)

    def fit_cache(self) -> None:
        """Cache the tug's shape as it lies on screen now (see app.board.cache); a tug
        being dragged has none (its label, fixed in pixels, never turns)."""
        if not self._dragging:
            self.glyph.setCacheMode(still_mode(self.glyph))

    def set_selected(self, on: bool) -> None:
        if on == self._selected:
            return
        self._changed()
        self._selected = on
        self.glyph.set_selected(on)


class BalanceDrawing:
    """The balance of one body: net force, yaw moment, line of action and what they mean."""

    def __init__(self, root: Root, changes: Changes | None = None) -> None:
        self.changes = changes or Changes()
        self.root = root
        self.centroid = Mark("centroid", root, 16)
        self.cog = Mark("cog", root, 14)
        self.centroid.setToolTip("Centroid of the outline (moments are taken about it)")
        self.cog.setToolTip("Centre of gravity")
        for m in (self.centroid, self.cog):
            m.setZValue(Z_FITTING)
        self.net = Arrow(style.NET_FORCE, 4.0, root)
        self.net.setZValue(Z_BALANCE)
        self.moment = MomentArrow(style.MOMENT, 3.2, root)
        self.moment.setZValue(Z_BALANCE)
        self.action = PiecedLine(root)  # a drag repaints a band along it, not the board
        self.action.setPen(style.pen(style.LINE_OF_ACTION, 1.0, Qt.PenStyle.DashLine))
        self.action.setZValue(Z_BALANCE - 0.5)
        self.crossing = Mark("crossing", root, 14)
        self.crossing.color = style.LINE_OF_ACTION
        self.crossing.setZValue(Z_FITTING)
        self.net_label = Label("", root, style.NET_FORCE, style.label_font(9, True), (10, 0))
        self.moment_label = Label(
            "", root, style.MOMENT, style.label_font(9, True), (-8, 0), "right"
        )
        self.cross_label = Label("", root, style.LINE_OF_ACTION, style.label_font(8.5), (10, 14))
        self.state = Label("", root, style.TEXT, style.label_font(10, True), (0, 0), "centre")
        self.stale = Label("", root, style.INVALID, style.label_font(10, True), (0, -30), "centre")
        for lab in (self.net_label, self.moment_label, self.cross_label, self.state, self.stale):
            lab.setZValue(Z_LABEL)
            lab.setCacheMode(NO_CACHE)  # their text changes on every move of a drag
        self.state.priority = self.stale.priority = 0
        self.net_label.priority = self.moment_label.priority = 2
        self.cross_label.priority = 4
        self.action.setData(GUIDE, True)  # it runs across the board
        self.loads: list[tuple[Arrow, Label]] = []
        self._loads_key: tuple[object, ...] | None = None
        self._moment_label_key: tuple[float, str] | None = None

    def set_moving(self, on: bool) -> None:
        """While a drag moves the balance on every step, its arrows repaint a band along
        themselves, not their boxes (see app.board.items._ArrowItem)."""
        self.net.set_banded(on)
        self.moment.set_banded(on)

    def update(
        self,
        balance: Balance,
        body: Body,
        units: DisplayUnits,
        force_scale: float,
        moment_scale: float,
        head: float,
        stale: str | None,
    ) -> None:
        eq = balance.equivalent
        cx, cy = balance.centroid
        self.centroid.setPos(cx, cy)
        gx, gy = balance.centre_of_gravity
        self.cog.setPos(gx, gy)
        self.cog.setVisible(math.hypot(gx - cx, gy - cy) > 1e-6 * max(body.length, 1.0))
        colour = style.STALE if stale else None
        fx, fy = eq.force
        length = math.hypot(fx, fy) * force_scale
        self.net.set_color(colour or style.NET_FORCE)
        if eq.kind == "force":
            tip = (cx + fx * force_scale, cy + fy * force_scale)
            self.net.set_geometry((cx, cy), tip, head * 1.4)
            self.net.setVisible(length > 1e-6)
            self.net_label.setPos(*tip)
            self.net_label.set_text(f"net force {units.show(eq.magnitude, 'force')}")
            self.net_label.setVisible(True)
        else:
            self.net.setVisible(False)
            self.net_label.setVisible(False)
        # yaw moment: the arc sweeps in proportion to |M| against the fleet's largest moment
        m = eq.moment
        arc = moment_arc(m, moment_scale, body.length, body.beam)
        self.moment.set_color(colour or style.MOMENT)
        if arc is not None:
            r, start, sweep = arc
            self.moment.set_geometry((cx, cy), r, start, sweep, head * 1.2)
            self.moment.setVisible(True)
            # the label sits just outside the middle of the arc, astern of the centroid
            self.moment_label.setPos(cx - r, cy)
            # the unit's own digits, as the balance panel, the report and the briefing
            self.moment_label.set_text(f"yaw {signed(units, m, 'moment')}\n{balance.turning}")
            sa = math.radians(_screen_angle(self.root, (-1.0, 0.0)))
            if (sa, self.moment_label.text) != self._moment_label_key:
                self._moment_label_key = (sa, self.moment_label.text)
                self.moment_label.set_outward(math.cos(sa), math.sin(sa), 6.0)
            self.moment_label.setVisible(True)
        else:
            self.moment.setVisible(False)
            self.moment_label.setVisible(False)
        # the equivalent force's line of action, across the board
        if eq.kind == "force" and eq.point is not None and eq.direction is not None:
            px, py = eq.point
            ux, uy = eq.direction
            # long enough to cross the board round the body; a longer dashed line only costs
            reach = 1.3 * (body.length + body.beam) + 2 * TUG_LENGTH_M
            self.action.setLine(
                QLineF(px - ux * reach, py - uy * reach, px + ux * reach, py + uy * reach)
            )
            self.action.setVisible(True)
            self.action.setPen(style.pen(colour or style.LINE_OF_ACTION, 1.0, Qt.PenStyle.DashLine))
            if balance.crossing_shown and balance.centreline_x is not None:
                self.crossing.setPos(balance.centreline_x, 0.0)
                self.crossing.setVisible(True)
                self.cross_label.setPos(balance.centreline_x, 0.0)
                self.cross_label.set_text(
                    f"line of action crosses {balance.centreline}\n"
                    f"at x = {units.show(balance.centreline_x, 'length')}"
                )
                self.cross_label.setVisible(True)
            else:
                self.crossing.setVisible(False)
                self.cross_label.setVisible(False)
        else:
            self.action.setVisible(False)
            self.crossing.setVisible(False)
            self.cross_label.setVisible(False)
        # ahead of the centroid to starboard, clear of the yaw arrow (drawn astern of it)
        self.state.setPos(cx + 0.25 * body.length, cy - 0.22 * body.beam)
        self.state.set_text("" if eq.kind == "force" else balance.equivalent_words(units))
        self.state.setVisible(eq.kind != "force")
        self.stale.setPos(cx, cy)
        # the board says it briefly; the balance panel gives the whole reason
        short = stale.split(" (", 1)[0].split(":", 1)[0] if stale else ""
        self.stale.set_text(
            f"STALE: {short}\nthe balance shown is the last valid one" if stale else ""
        )
        for lab, normal in (
            (self.net_label, style.NET_FORCE),
            (self.moment_label, style.MOMENT),
            (self.cross_label, style.LINE_OF_ACTION),
        ):
            lab.set_color(style.STALE if stale else normal)
        self.stale.setVisible(bool(stale))
        self._update_loads(balance, units, force_scale, head)

    def _update_loads(
        self, balance: Balance, units: DisplayUnits, scale: float, head: float
    ) -> None:
        key = (tuple((ld.name, ld.point, ld.force) for ld in balance.loads), units, scale, head)
        if key == self._loads_key:
            return  # the same loads (a tug drag leaves the wind and the current alone)
        self._loads_key = key
        self.changes.count += 1
        while len(self.loads) > len(balance.loads):
            for item in self.loads.pop():
                take_out(item)
        while len(self.loads) < len(balance.loads):
            a = Arrow(style.LOAD_FORCE, 3.0, self.root)
            a.setZValue(Z_FORCE)
            lab = Label(
                "", self.root, style.LOAD_FORCE, style.label_font(8.5, True), (0, -12), "centre"
            )
            lab.setZValue(Z_LABEL)
            lab.priority = 3
            self.loads.append((a, lab))
        for (a, lab), ld in zip(self.loads, balance.loads, strict=True):
            px, py = ld.point
            fx, fy = ld.force
            start = (px - fx * scale, py - fy * scale)  # a load is drawn arriving at its point
            a.set_geometry(start, (px, py), head)
            a.set_color(style.load_color(ld.name))
            lab.set_color(style.load_color(ld.name))
            lab.setPos(*start)
            lab.set_text(f"{ld.name} {units.show(math.hypot(fx, fy), 'force')}")

    def hide(self) -> None:
        for item in (
            self.net,
            self.moment,
            self.action,
            self.crossing,
            self.net_label,
            self.moment_label,
            self.cross_label,
            self.state,
            self.stale,
        ):
            item.setVisible(False)


TugText = Callable[[TugShare], str]


class BodyDrawing:
    """Everything about one body, under one root placed by the body's pose."""

    def __init__(self, scene: QGraphicsScene, name: str) -> None:
        self.name = name
        self.root = Root()
        scene.addItem(self.root)
        self.hulls: dict[str, HullDrawing] = {}
        self.tugs: dict[str, TugDrawing] = {}
        #: Every change to the hulls, the tugs and the loads drawn (see still_changes).
        self.changes = Changes()
        self.balance = BalanceDrawing(self.root, self.changes)
        self.body: Body | None = None
        self._pose: BodyPose | None = None

    def still_changes(self, moving_tug: str | None) -> int:
        """A count that grows whenever an item of this body changes, other than the
        ``moving_tug``'s and the balance's own arrows and labels (the loads count)."""
        t = self.tugs.get(moving_tug) if moving_tug is not None else None
        return self.changes.count - (t.revision if t is not None else 0)

    def set_pose(self, pose: BodyPose, site_angle_deg: float) -> None:
        if pose == self._pose:
            return
        self._pose = pose
        self.changes.count += 1
        self.root.setPos(pose.x, pose.y)
        self.root.setRotation(site_angle_deg)
        for h in self.hulls.values():
            h.refresh_screen_angles()
            h.fit_cache()  # a device cache only while the body lies unturned on screen
        for t in self.tugs.values():
            t._key = None  # the labels' side on screen turned with the body
            t.fit_cache()

    def set_body(self, body: Body) -> None:
        self.body = body
        self.changes.count += 1
        names = {m.hull.name for m in body.members}
        for name in list(self.hulls):
            if name not in names:
                d = self.hulls.pop(name)
                self.changes.count += 1
                take_out(d.frame)
        for m in body.members:
            if m.hull.name in self.hulls:
                self.hulls[m.hull.name].set_member(m)
            else:
                self.hulls[m.hull.name] = HullDrawing(self.root, m, self.changes)
            self.hulls[m.hull.name].hide_inner_sides(body, m)

    def set_tugs(
        self,
        balance: Balance | None,
        points: dict[str, tuple[tuple[float, float], tuple[float, float]]],
        force_scale: float,
        head: float,
        text: TugText,
        moving: bool = False,
    ) -> None:
        """Draw the tugs of ``balance``; ``moving``: a drag is under way."""
        shares = balance.shares if balance is not None else ()
        names = {s.tug for s in shares}
        for name in list(self.tugs):
            if name not in names:
                self.tugs.pop(name).remove()
        for s in shares:
            d = self.tugs.get(s.tug)
            if d is None:
                d = self.tugs[s.tug] = TugDrawing(self.root, s.tug, self.changes)
            point, direction = points[s.tug]
            d.update(s, point, direction, force_scale, head, text, moving)

    def remove(self) -> None:
        if self.root.scene() is not None:
            self.root.scene().removeItem(self.root)
