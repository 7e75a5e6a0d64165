"""The board's context menus: what can be done to the thing under the cursor.

``board_menu(scene, pos)`` builds the menu for site point ``pos`` (m): a tug, a line or
push point, a vertex, a body (lash, unlash, turn), a site feature or one of its points,
or open water. Other parts of the program add their own entries through
``scene.menu_hooks``: callables ``(menu, target) -> None`` where ``target`` is the
role of the thing under the cursor (for example ``("tug", "Gannet")``) or None.

Every entry edits through the controller, so each is one undo step.
"""

from __future__ import annotations

import math
from dataclasses import replace
from typing import TYPE_CHECKING

from PySide6.QtCore import QPointF
from PySide6.QtWidgets import QInputDialog, QMenu, QWidget

from app.edits import bodies as body_edits
from app.edits import sectors
from app.guard import guarded
from core.errors import TowboardError
from core.mechanics.bodies import body_name_of_hull
from core.model.plan import Stage
from core.model.swing import Swing
from core.model.tugs import Placement, setting_words

if TYPE_CHECKING:
    from app.board.scene import BoardScene


def target_at(scene: BoardScene, pos: QPointF) -> tuple[object, ...] | None:
    """What is under site point ``pos``: an item's role, a site feature, or None (water)."""
    hit = scene.interaction._hit(pos)
    if hit is not None and hit[0] == "sector":  # a knob of a tug's working sector
        return ("tug", hit[1])
    if hit is not None and hit[0] in ("tug", "fitting", "vertex", "hull", "turn", "site_point"):
        return hit
    layer = getattr(scene, "site_layer", None)
    if layer is not None:
        name = layer.feature_at(pos, scene.pixels_per_metre())
        if name is not None:
            return ("site", name)
    return None


def _parent(scene: BoardScene) -> QWidget | None:
    views = scene.views()
    return views[0] if views else None


def _run(scene: BoardScene, what: str, edit) -> None:  # type: ignore[no-untyped-def]
    """Run an edit; an impossible one is said on the status bar."""
    try:
        edit()
    except TowboardError as e:
        scene.controller.message.emit(f"{what}: not done ({e})")


def board_menu(scene: BoardScene, pos: QPointF) -> QMenu:
    """The context menu for site point ``pos`` (the thing there is selected first)."""
    target = target_at(scene, pos)
    menu = QMenu(_parent(scene))
    if target is not None and target[0] != "turn":
        scene.select(target)
    match target:
        case ("tug", tug, *_):
            _tug_entries(scene, menu, str(tug))
        case ("fitting", _, name, *_):
            menu.addAction(f"Delete {name}", scene.interaction.delete_selection)
        case ("vertex", hull, int(i), *_):
            menu.addAction(f"Delete vertex {i + 1}", scene.interaction.delete_selection)
            _body_entries(scene, menu, str(hull))
        case ("hull" | "turn", hull_or_body, *_):
            _body_entries(scene, menu, str(hull_or_body))
        case ("site_point", feature, int(i), *_):
            menu.addAction(f"Delete point {i + 1}", scene.interaction.delete_selection)
            _site_entries(scene, menu, str(feature))
        case ("site", feature, *_):
            _site_entries(scene, menu, str(feature))
        case _:
            _water_entries(scene, menu)
    for hook in getattr(scene, "menu_hooks", ()):
        hook(menu, target)
    return menu


def _tug_entries(scene: BoardScene, menu: QMenu, tug: str) -> None:
    inter = scene.interaction
    stage = scene.controller.stage
    if stage is None:
        return
    try:
        setting = stage.placement(tug).setting
    except TowboardError:
        return
    sub = menu.addMenu(f"Setting of {tug} ({setting_words(setting)})")
    for pct in (0, 25, 50, 75, 100):
        sub.addAction(f"{pct} %", guarded(lambda p=pct: inter.step_setting(tug, p / 100 - setting)))
    _sector_entries(scene, menu, stage, tug)
    menu.addSeparator()
    menu.addAction(f"Let go {tug}", inter.delete_selection)


def _sector_entries(scene: BoardScene, menu: QMenu, stage: Stage, tug: str) -> None:
    """The working sector of ``tug`` in ``stage`` (about its lead as set, the whole circle,
    none) and, at a push point, whether it is made fast (push-pull); each one undo step."""
    c = scene.controller
    placement = stage.placement(tug)
    at_push = c.project.hull(placement.hull).fitting(placement.point).kind == "push"

    def put(new: Placement, text: str) -> None:
        _run(scene, text, lambda: c.apply(c.with_stage(stage.with_placement(new)), text))

    width = math.degrees(placement.sector_width_rad)
    now = (
        "lead as set"
        if placement.lead_sector_rad is None
        else ("whole circle" if sectors.is_whole_circle(placement) else f"{width:.0f}° wide")
    )
    sub = menu.addMenu(f"Working sector of {tug} ({now})")
    what = f"Working sector of {tug}"
    for half in (15, 30, 45, 60, 90):
        sub.addAction(
            f"{half}° either side of the lead now",
            guarded(lambda h=half: put(sectors.about_lead(placement, h), what)),
        )
    sub.addAction("Whole circle", guarded(lambda: put(sectors.whole_circle(placement), what)))
    sub.addAction(
        "None: keep the lead as set", guarded(lambda: put(placement.with_sector(None), what))
    )
    if at_push:
        act = menu.addAction(f"{tug} made fast (push-pull)")
        act.setCheckable(True)
        act.setChecked(placement.push_pull)
        act.setToolTip("Made fast at the push point, the tug can push or pull")
        act.toggled.connect(
            guarded(lambda on: put(sectors.with_push_pull(placement, True, on), f"{tug} push-pull"))
        )


def _body_entries(scene: BoardScene, menu: QMenu, hull_or_body: str) -> None:
    c = scene.controller
    project = c.project
    group = next((g for g in project.groups if g.name == hull_or_body), None)
    if group is None:
        group = project.group_of(hull_or_body)
    body = group.name if group is not None else body_name_of_hull(project, hull_or_body)
    menu.addAction(f"Turn {body} to heading…", guarded(lambda: _ask_heading(scene, body)))
    _swing_entries(scene, menu, body)
    menu.addSeparator()
    if group is not None:
        menu.addAction(f"Rename {group.name}…", guarded(lambda: _ask_group_name(scene, group.name)))
        menu.addAction(
            f"Unlash {group.name}",
            guarded(
                lambda: _run(
                    scene,
                    f"Unlash {group.name}",
                    lambda: c.apply(
                        body_edits.unlashed(c.project, group.name), f"Unlash {group.name}"
                    ),
                )
            ),
        )
        return
    free = [
        h.name for h in project.hulls if h.name != hull_or_body and project.group_of(h.name) is None
    ]
    lash = menu.addMenu(f"Lash {hull_or_body} to")
    lash.setEnabled(bool(free) and bool(project.stages))
    for other in free:
        lash.addAction(other, guarded(lambda o=other: _lash(scene, hull_or_body, o)))


def _swing_entries(scene: BoardScene, menu: QMenu, body: str) -> None:
    """A swing stage: its start or end heading from where the body lies, or the other way."""
    c = scene.controller
    stage = c.stage
    if stage is None or (stage.kind != "swing" and stage.swing is None):
        return
    now = scene.pose(body).heading_deg
    swing = stage.swing
    menu.addSeparator()

    def set_swing(new: Swing | None, text: str) -> None:
        _run(scene, text, lambda: c.apply(c.with_stage(replace(stage, swing=new)), text))

    def from_here(end: bool) -> None:
        # with no swing yet, the other end is a quarter turn to port
        base = swing or Swing(now, (now - 90.0) % 360.0, "port")
        what = "end" if end else "start"
        try:
            if end:
                new = replace(base, end_heading_deg=now)
            else:
                new = replace(base, start_heading_deg=now)
        except TowboardError as e:
            c.message.emit(f"Swing {what}: not set ({e})")
            return
        set_swing(new, f"Swing {what}s on {now:05.1f}°")

    menu.addAction(
        f"Swing starts on this heading ({now:05.1f}°)", guarded(lambda: from_here(False))
    )
    menu.addAction(f"Swing ends on this heading ({now:05.1f}°)", guarded(lambda: from_here(True)))
    if swing is None:
        return
    for what, heading in (("start", swing.start_heading_deg), ("end", swing.end_heading_deg)):
        menu.addAction(
            f"Lie at the swing's {what} ({heading:05.1f}°)",
            guarded(
                lambda h=heading, w=what: _run(
                    scene,
                    f"Lie at the swing's {w}",
                    lambda: c.apply(
                        c.with_stage(body_edits.turned_body(c.project, stage, body, h)),
                        f"Turn {body} to the swing's {w}",
                    ),
                )
            ),
        )


def _lash(scene: BoardScene, hull: str, other: str) -> None:
    c = scene.controller

    def edit() -> None:
        hulls = (hull, other)
        name = body_edits.group_name(c.project, hulls)
        c.apply(
            body_edits.lashed(c.project, c.stage_index, hulls, name), f"Lash {hull} and {other}"
        )
        scene.select(("hull", hull))

    _run(scene, f"Lash {hull} and {other}", edit)


def _ask_heading(scene: BoardScene, body: str) -> None:
    c = scene.controller
    if c.stage is None:
        return
    now = scene.pose(body).heading_deg
    value, ok = QInputDialog.getDouble(
        _parent(scene), "Turn to heading", f"True heading of {body} (°):", now, 0.0, 360.0, 1
    )
    if not ok:
        return
    stage = c.stage

    def edit() -> None:
        new = body_edits.turned_body(c.project, stage, body, value % 360.0)
        c.apply(c.with_stage(new), f"Turn {body} to {value % 360.0:05.1f}°")

    _run(scene, f"Turn {body}", edit)


def _site_entries(scene: BoardScene, menu: QMenu, name: str) -> None:
    tools = scene.interaction.site
    menu.addAction(f"Rename {name}…", guarded(lambda: _ask_rename(scene, name)))
    f = next((x for x in scene.controller.project.site.features if x.name == name), None)
    if f is not None:
        act = menu.addAction("Closed outline")
        act.setCheckable(True)
        act.setChecked(f.closed)
        act.setToolTip("Closed: an area, the last point joined to the first; open: a line")
        act.toggled.connect(
            guarded(
                lambda on: _run(
                    scene,
                    f"{'Close' if on else 'Open'} the outline of {name}",
                    lambda: tools.set_closed(name, on),
                )
            )
        )
    menu.addAction(
        f"Delete {name}",
        guarded(lambda: _run(scene, f"Delete {name}", lambda: tools.delete(("site", name)))),
    )


def _ask_group_name(scene: BoardScene, name: str) -> None:
    c = scene.controller
    new, ok = QInputDialog.getText(_parent(scene), "Rename lashed group", "Name:", text=name)
    if not ok or new.strip() == name:
        return
    _run(
        scene,
        f"Rename {name}",
        lambda: c.apply(body_edits.renamed_group(c.project, name, new), f"Rename {name}"),
    )


def _ask_rename(scene: BoardScene, name: str) -> None:
    new, ok = QInputDialog.getText(_parent(scene), "Rename site feature", "Name:", text=name)
    if ok and new.strip() and new.strip() != name:
        _run(scene, f"Rename {name}", lambda: scene.interaction.site.rename(name, new))


def _water_entries(scene: BoardScene, menu: QMenu) -> None:
    views = scene.views()
    if views:
        view = views[0]
        for text, slot in (("Fit to hull", "fit_to_hull"), ("Fit to site", "fit_to_site")):
            if hasattr(view, slot):
                menu.addAction(text, guarded(getattr(view, slot)))
