"""The site's features: a list with Add (from simple parameters) and Delete.

Features are made by core.mechanics.site from a few numbers in the display length unit: a
straight quay from two points, a round or square dolphin from its centre and size, a
moored vessel from its centre, heading, length and beam, a channel from its centre
line and width, a rectangular basin from two corners. Edits are undoable.
"""

from __future__ import annotations

from dataclasses import replace

from PySide6.QtWidgets import (
    QComboBox,
    QDialog,
    QFormLayout,
    QHBoxLayout,
    QLabel,
    QLineEdit,
    QListWidget,
    QPushButton,
    QStackedWidget,
    QVBoxLayout,
    QWidget,
)

from app.controller import Controller
from app.guard import guarded
from app.numbers import message, parse_number
from app.panels.dialog_parts import ok_cancel
from core.errors import InputError
from core.mechanics.site import basin, channel, dolphin, moored_vessel, quay
from core.model.plan import SiteFeature
from core.units import DisplayUnits, label

#: kind key -> (title, fields: (key, label, is_length))
KINDS: dict[str, tuple[str, tuple[tuple[str, str, bool], ...]]] = {
    "quay": (
        "Quay (a straight face)",
        (
            ("x0", "Start x", True),
            ("y0", "Start y", True),
            ("x1", "End x", True),
            ("y1", "End y", True),
        ),
    ),
    "dolphin": (
        "Dolphin",
        (("x", "Centre x", True), ("y", "Centre y", True), ("size", "Diameter or side", True)),
    ),
    "vessel": (
        "Moored vessel",
        (
            ("x", "Centre x", True),
            ("y", "Centre y", True),
            ("heading", "Heading (° true)", False),
            ("length", "Length", True),
            ("beam", "Beam", True),
        ),
    ),
    "channel": (
        "Channel edges (two limit lines)",
        (
            ("x0", "Centre line start x", True),
            ("y0", "Centre line start y", True),
            ("x1", "Centre line end x", True),
            ("y1", "Centre line end y", True),
            ("width", "Width", True),
        ),
    ),
    "basin": (
        "Basin limit (a rectangle)",
        (
            ("x0", "Corner x", True),
            ("y0", "Corner y", True),
            ("x1", "Opposite x", True),
            ("y1", "Opposite y", True),
        ),
    ),
}


def make_features(
    kind: str, name: str, values: dict[str, float], units: DisplayUnits, shape: str = "round"
) -> tuple[SiteFeature, ...]:
    """The feature(s) of ``kind`` from the values typed (lengths in the display unit)."""
    if not name.strip():
        raise InputError("name", name, "must not be empty")
    lengths = {k for k, _text, is_len in KINDS[kind][1] if is_len}
    m = {k: units.si(v, "length") if k in lengths else v for k, v in values.items()}
    if kind == "quay":
        return (quay(name, (m["x0"], m["y0"]), (m["x1"], m["y1"])),)
    if kind == "dolphin":
        return (dolphin(name, (m["x"], m["y"]), m["size"], shape),)
    if kind == "vessel":
        return (
            moored_vessel(
                name, (m["x"], m["y"]), m["heading"], m["length"], m["beam"], 0.12 * m["length"]
            ),
        )
    if kind == "channel":
        return channel(name, (m["x0"], m["y0"]), (m["x1"], m["y1"]), m["width"])
    x0, y0, x1, y1 = m["x0"], m["y0"], m["x1"], m["y1"]
    return (basin(name, [(x0, y0), (x1, y0), (x1, y1), (x0, y1)]),)


class FeatureDialog(QDialog):
    """Parameters of a new site feature."""

    def __init__(self, units: DisplayUnits, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.setWindowTitle("Add a site feature")
        self.units = units
        self.kind = QComboBox(self)
        for key, (title, _f) in KINDS.items():
            self.kind.addItem(title, key)
        self.name = QLineEdit(self)
        self.shape = QComboBox(self)
        self.shape.addItems(["round", "square"])
        self.pages = QStackedWidget(self)
        self.fields: dict[str, dict[str, QLineEdit]] = {}
        ln = label(units.unit("length"))
        for key, (_title, fields) in KINDS.items():
            page = QWidget(self)
            form = QFormLayout(page)
            self.fields[key] = {}
            for fk, text, is_len in fields:
                f = QLineEdit(page)
                f.setObjectName(f"{key}_{fk}")
                form.addRow(f"{text}{f' ({ln})' if is_len else ''}", f)
                self.fields[key][fk] = f
            if key == "dolphin":
                form.addRow("Shape", self.shape)
            self.pages.addWidget(page)
        self.kind.currentIndexChanged.connect(self.pages.setCurrentIndex)
        self.error = QLabel(self)
        self.error.setStyleSheet("color: #b3261e")
        self.error.setWordWrap(True)
        buttons = ok_cancel(self, accept=self._try_accept, parent=self)
        top = QFormLayout()
        top.addRow("Kind", self.kind)
        top.addRow("Name", self.name)
        layout = QVBoxLayout(self)
        layout.addLayout(top)
        layout.addWidget(QLabel("Site frame: x east, y north.", self))
        layout.addWidget(self.pages)
        layout.addWidget(self.error)
        layout.addWidget(buttons)
        self.features: tuple[SiteFeature, ...] = ()

    def set_kind(self, kind: str) -> None:
        self.kind.setCurrentIndex(list(KINDS).index(kind))

    def build(self) -> tuple[SiteFeature, ...]:
        kind = self.kind.currentData()
        values = {
            k: parse_number(self.fields[kind][k].text(), text.lower())
            for k, text, _l in KINDS[kind][1]
        }
        return make_features(
            kind, self.name.text().strip(), values, self.units, self.shape.currentText()
        )

    @guarded
    def _try_accept(self) -> None:
        try:
            self.features = self.build()
        except InputError as e:
            self.error.setText(message(e, self.units))
            return
        self.accept()


class SitePanel(QWidget):
    """The plan's site features, with Add and Delete."""

    def __init__(self, controller: Controller, parent: QWidget | None = None) -> None:
        super().__init__(parent)
        self.controller = controller
        self.setObjectName("site_panel")
        self.list = QListWidget(self)
        self.add_button = QPushButton("Add…", self)
        self.delete_button = QPushButton("Delete", self)
        self.add_button.clicked.connect(self.add)
        self.delete_button.clicked.connect(self.delete)
        row = QHBoxLayout()
        row.addWidget(self.add_button)
        row.addWidget(self.delete_button)
        row.addStretch(1)
        layout = QVBoxLayout(self)
        layout.setContentsMargins(4, 4, 4, 4)
        self.title = QLabel(self)
        layout.addWidget(self.title)
        layout.addWidget(self.list, 1)
        layout.addLayout(row)
        controller.follow(self.fill, self, Controller.all_but_placements)
        self.fill()

    @guarded
    def fill(self) -> None:
        site = self.controller.project.site
        rows = [f"{f.name}  [{f.kind}]" for f in site.features]
        if [self.list.item(i).text() for i in range(self.list.count())] != rows:
            current = self.list.currentRow()
            self.list.clear()
            self.list.addItems(rows)
            if rows:
                self.list.setCurrentRow(min(max(current, 0), len(rows) - 1))
        self.title.setText(f"<b>{site.name or 'The site'}</b> ({len(rows)} features)")
        self.delete_button.setEnabled(bool(rows))

    def dialog(self) -> FeatureDialog:
        return FeatureDialog(self.controller.project.units, self)

    @guarded
    def add(self) -> None:
        d = self.dialog()
        if d.exec() != QDialog.DialogCode.Accepted or not d.features:
            return
        self.add_features(d.features)

    def add_features(self, features: tuple[SiteFeature, ...]) -> None:
        p = self.controller.project
        taken = {f.name for f in p.site.features}
        clash = next((f.name for f in features if f.name in taken), None)
        if clash is not None:
            self.controller.message.emit(f"Not added: a site feature is already called {clash}")
            return
        site = replace(p.site, features=(*p.site.features, *features))
        self.controller.apply(replace(p, site=site), f"Add {', '.join(f.name for f in features)}")

    @guarded
    def delete(self) -> None:
        i = self.list.currentRow()
        p = self.controller.project
        if not 0 <= i < len(p.site.features):
            return
        name = p.site.features[i].name
        site = replace(p.site, features=p.site.features[:i] + p.site.features[i + 1 :])
        self.controller.apply(replace(p, site=site), f"Delete {name}")
