"""The winding cards: one self-contained HTML page per coil type, the form drawn to scale in inline SVG.

Each drawing takes the figures of one placement (:func:`coilplan.kit.outputs.placement_fields`) and
draws the form at one scale, in pixels per metre, stated under it:

==============  ==================================================================================
form            drawing
==============  ==================================================================================
solenoid        side view of the former with every turn (a band beyond 400 turns)
toroid          top view of the ring with the turns round it, and its section
rod             side view of the rod (and its former), the winding centred on it
gapped          section through the centre leg and the winding window: the gap, the layers
multilayer      section through the bobbin: the core, the cheeks and the layers
==============  ==================================================================================

A tap is marked in red at its turn, numbered from the start of the winding (on a layered form: its
layer, and where along it, the layers wound back and forth from the first cheek).
"""

from __future__ import annotations

import html
import math
import re

from coilplan.quantities import format_length, format_quantity

__all__ = ["card_files", "winding_card"]

_STYLE = ("body{font-family:sans-serif;max-width:44em;margin:1em auto;color:#111}"
          "table{border-collapse:collapse}td{padding:2px 10px 2px 0;vertical-align:top}"
          "h2{margin-top:1.5em;border-bottom:1px solid #888}svg text{font-size:11px;font-family:sans-serif}"
          ".c{color:#900}")
_COPPER = "#b45f06"
_TAP = "#d00"
#: Beyond this many turns a winding is drawn as a band, not turn by turn.
_MOST_DRAWN = 400


def _henry(value: float) -> str:
    return format_quantity(value, "H", 4)


def _mm(value: float) -> str:
    return html.escape(format_length(value))


def _text(x: float, y: float, words: str, anchor: str = "start") -> str:
    return f'<text x="{x:.1f}" y="{y:.1f}" text-anchor="{anchor}">{words}</text>'


def _rect(x: float, y: float, width: float, height: float, fill: str, stroke: str = "#333", extra: str = "") -> str:
    return (f'<rect x="{x:.2f}" y="{y:.2f}" width="{max(width, 0.0):.2f}" height="{max(height, 0.0):.2f}" '
            f'fill="{fill}" stroke="{stroke}"{extra}/>')


def _tap_mark(x: float, y: float, turn: int) -> list[str]:
    return [f'<circle cx="{x:.2f}" cy="{y:.2f}" r="3.5" fill="{_TAP}"/>',
            f'<text x="{x + 5:.1f}" y="{y - 5:.1f}" fill="{_TAP}">tap, turn {turn}</text>']


def _svg(parts: list[str], width: float, height: float, scale: float) -> str:
    note = f"drawn to scale: 1 mm = {scale / 1000:.3g} px"
    return (f'<svg xmlns="http://www.w3.org/2000/svg" width="{width:.0f}" height="{height + 16:.0f}" '
            f'viewBox="0 0 {width:.0f} {height + 16:.0f}" role="img" aria-label="{note}">'
            + "".join(parts) + f'<text x="4" y="{height + 12:.0f}">{note}</text></svg>')


def _single_layer(parts: list[str], start: float, top: float, height: float, p: dict, scale: float) -> None:
    """The turns of a single-layer winding from ``start`` (px), each across ``height`` px from ``top``."""
    turns, pitch = p["turns"], p["pitch_m"] * scale
    if turns <= _MOST_DRAWN:
        for k in range(turns):
            x = start + (k + 0.5) * pitch
            parts.append(f'<line x1="{x:.2f}" y1="{top - 2:.1f}" x2="{x:.2f}" y2="{top + height + 2:.1f}" '
                         f'stroke="{_COPPER}" stroke-width="{max(pitch * 0.6, 0.5):.2f}"/>')
    else:
        parts.append(_rect(start, top - 2, p["winding_length_m"] * scale, height + 4, _COPPER, "none",
                           ' opacity="0.6"'))
    if p["tap_turn"] is not None:
        parts += _tap_mark(start + (p["tap_turn"] - 0.5) * pitch, top - 2, p["tap_turn"])


def _solenoid_svg(p: dict) -> str:
    """Side view of the former with the winding, to scale."""
    length, diameter, winding = p["former_length_m"], p["former_diameter_m"], p["winding_length_m"]
    scale = 360.0 / max(length, diameter)  # px per metre
    w, h = length * scale, diameter * scale
    x0, y0 = 60.0, 30.0
    parts = [_rect(x0, y0, w, h, "#eee")]
    _single_layer(parts, x0 + (w - winding * scale) / 2.0, y0, h, p, scale)
    parts += [_text(x0 + w / 2, y0 + h + 22, f"former length {_mm(length)}; winding {_mm(winding)}", "middle"),
              _text(x0 - 6, y0 + h / 2, f"⌀ {_mm(diameter)}", "end")]
    return _svg(parts, x0 + w + 40, y0 + h + 40, scale)


def _rod_svg(p: dict) -> str:
    """Side view of the rod, and of the former round it if any, with the winding centred, to scale."""
    length, diameter, winding = p["rod_length_m"], p["rod_diameter_m"], p["winding_length_m"]
    former = p["former_diameter_m"]
    outside = former if former else diameter
    scale = 420.0 / max(length, outside)
    w = length * scale
    x0, y0 = 60.0, 40.0
    h_out = outside * scale
    centre = y0 + h_out / 2
    parts = []
    if former:
        parts.append(_rect(x0, y0, w, h_out, "#f4f4f4"))
    parts.append(_rect(x0, centre - diameter * scale / 2, w, diameter * scale, "#555", "#222"))
    _single_layer(parts, x0 + (w - winding * scale) / 2.0, y0, h_out, p, scale)
    label = f"rod {_mm(length)} long, ⌀ {_mm(diameter)}" + (f", on a ⌀ {_mm(former)} former" if former else "")
    parts += [_text(x0 + w / 2, y0 + h_out + 22, f"{label}; winding {_mm(winding)}, centred", "middle"),
              _text(x0 - 6, centre + 4, f"⌀ {_mm(outside)}", "end")]
    return _svg(parts, x0 + w + 40, y0 + h_out + 40, scale)


def _toroid_svg(p: dict) -> str:
    """Top view of the ring with the turns spread round it, and its section, to scale."""
    od, inner, height = p["od_m"], p["id_m"], p["height_m"]
    scale = 260.0 / od
    cx, cy = 20 + od * scale / 2, 24 + od * scale / 2
    ro, ri = od * scale / 2, inner * scale / 2
    parts = [f'<circle cx="{cx:.1f}" cy="{cy:.1f}" r="{ro:.1f}" fill="#ddd" stroke="#333"/>',
             f'<circle cx="{cx:.1f}" cy="{cy:.1f}" r="{ri:.1f}" fill="#fff" stroke="#333"/>']
    turns = p["turns"]
    for k in range(min(turns, _MOST_DRAWN)):
        angle = 2 * math.pi * k / turns
        c, s = math.cos(angle), math.sin(angle)
        parts.append(f'<line x1="{cx + (ri - 2) * c:.2f}" y1="{cy + (ri - 2) * s:.2f}" x2="{cx + (ro + 2) * c:.2f}" '
                     f'y2="{cy + (ro + 2) * s:.2f}" stroke="{_COPPER}" stroke-width="1"/>')
    if p["tap_turn"] is not None:
        angle = 2 * math.pi * (p["tap_turn"] - 1) / turns
        parts += _tap_mark(cx + (ro + 2) * math.cos(angle), cy + (ro + 2) * math.sin(angle), p["tap_turn"])
    sx = cx + ro + 40
    width = (od - inner) / 2 * scale
    parts += [_rect(sx, cy - height * scale / 2, width, height * scale, "#ddd"),
              _text(cx, cy + ro + 18, f"OD {_mm(od)}, ID {_mm(inner)}", "middle"),
              _text(sx, cy + height * scale / 2 + 16, f"height {_mm(height)}")]
    return _svg(parts, sx + width + 90, cy + ro + 30, scale)


def _layer_bands(parts, p, layer_pitch, along, across0, scale, vertical: bool):
    """The layers as bands: ``along`` px of winding width, from ``across0`` px outward one ``layer_pitch`` each.

    ``vertical``: the layers run up the page (a gapped core's window); else across it (a bobbin's section).
    A partial last layer is drawn as far as it goes, from the end its layer starts at. Returns the
    tap's (x, y) or None.
    """
    counts = p["layer_turns"]
    full = max(counts[0], 1)
    tap, tap_at = p["tap_turn"], None
    done = 0
    thickness = layer_pitch * scale
    for layer, count in enumerate(counts):
        fraction = min(count / full, 1.0)
        forward = layer % 2 == 0  # layers go back and forth, the first from the start end
        length = along * fraction
        offset = 0.0 if forward else along - length
        across = across0 + layer * thickness
        if vertical:
            parts.append(_rect(across, offset, thickness, length, _COPPER, "#7a3f04", ' opacity="0.75"'))
        else:
            parts.append(_rect(offset, across, length, thickness, _COPPER, "#7a3f04", ' opacity="0.75"'))
        if tap is not None and done < tap <= done + count:
            position = (tap - done - 0.5) / full * along
            position = position if forward else along - position
            tap_at = (across + thickness / 2, position) if vertical else (position, across + thickness / 2)
        done += count
    return tap_at


def _gapped_svg(p: dict) -> str:
    """Section through the centre leg and one winding window, with the gap and the layers, to scale.

    The centre leg is taken round (diameter from Ae), the window as the bobbin's width by depth; the
    outer leg is drawn half the centre leg's width (a drawing convention, not the core's data).
    """
    leg, width, depth = p["leg_diameter_m"], p["window_width_m"], p["window_depth_m"]
    gap = p["gap_m"] or 0.0
    yoke = leg / 2
    scale = 300.0 / max(width + 2 * yoke, leg / 2 + depth + leg / 2)
    x0, y0 = 80.0, 30.0
    half = leg / 2 * scale
    window_x, window_w, window_h = x0 + half, depth * scale, width * scale
    parts = [_rect(x0, y0, half, window_h + 2 * yoke * scale, "#999"),  # half the centre leg
             _rect(x0, y0, half + window_w + yoke * scale, yoke * scale, "#999"),  # top yoke
             _rect(x0, y0 + window_h + yoke * scale, half + window_w + yoke * scale, yoke * scale, "#999"),
             _rect(window_x + window_w, y0 + yoke * scale, yoke * scale, window_h, "#999"),  # outer leg
             _rect(window_x, y0 + yoke * scale, window_w, window_h, "#fff", "#333", ' stroke-dasharray="3,2"')]
    if gap > 0:
        middle = y0 + yoke * scale + window_h / 2
        parts.append(_rect(x0 - 1, middle - max(gap * scale, 1.0) / 2, half + 1, max(gap * scale, 1.0), "#fff",
                           "none"))
        parts.append(_text(x0 - 6, middle + 4, f"gap {_mm(gap)}", "end"))
    group: list[str] = []
    tap_at = _layer_bands(group, p, p["wire_pitch_m"], window_h, 0.0, scale, vertical=True)
    parts.append(f'<g transform="translate({window_x:.2f},{y0 + yoke * scale:.2f})">' + "".join(group) + "</g>")
    if tap_at is not None:
        parts += _tap_mark(window_x + tap_at[0], y0 + yoke * scale + tap_at[1], p["tap_turn"])
    bottom = y0 + window_h + 2 * yoke * scale
    parts += [_text(x0, bottom + 18, f"centre leg ⌀ {_mm(leg)} (taken round, from Ae)"),
              _text(x0, bottom + 32, f"window {_mm(width)} along the leg × {_mm(depth)} deep; {p['layers']} layers")]
    return _svg(parts, max(window_x + window_w + yoke * scale + 60, x0 + 300), bottom + 44, scale)


def _bobbin_svg(p: dict) -> str:
    """Section through the bobbin along its axis: the core, the cheeks and the layers above it, to scale.

    The cheeks are drawn 1 mm thick (their thickness is not in the plan).
    """
    diameter, width, depth = p["bobbin_diameter_m"], p["bobbin_width_m"], p["bobbin_depth_m"]
    cheek = 1e-3
    scale = 360.0 / max(width + 2 * cheek, diameter + 2 * depth)
    x0, y0 = 70.0, 30.0
    core_top = y0 + depth * scale
    core_h = diameter * scale
    left = x0 + cheek * scale
    parts = [_rect(left, core_top, width * scale, core_h, "#eee"),
             _rect(x0, y0, cheek * scale, (diameter + 2 * depth) * scale, "#ccc"),
             _rect(left + width * scale, y0, cheek * scale, (diameter + 2 * depth) * scale, "#ccc")]
    for side in (-1, 1):  # the layers above the core, mirrored below it
        group: list[str] = []
        tap_at = _layer_bands(group, p, p["layer_pitch_m"], width * scale, 0.0, scale, vertical=False)
        if side < 0:
            parts.append(f'<g transform="translate({left:.2f},{core_top:.2f}) scale(1,-1)">' + "".join(group)
                         + "</g>")
            if tap_at is not None:
                parts += _tap_mark(left + tap_at[0], core_top - tap_at[1], p["tap_turn"])
        else:
            parts.append(f'<g transform="translate({left:.2f},{core_top + core_h:.2f})">' + "".join(group) + "</g>")
    bottom = y0 + (diameter + 2 * depth) * scale
    parts += [_text(x0 - 6, core_top + core_h / 2 + 4, f"⌀ {_mm(diameter)}", "end"),
              _text(x0, bottom + 18, f"{_mm(width)} between the cheeks, {_mm(depth)} deep; {p['layers']} layers, "
                                     f"build {_mm(p['build_m'])} ({p['style']})")]
    return _svg(parts, left + width * scale + cheek * scale + 60, bottom + 30, scale)


_DRAWINGS = {"solenoid": _solenoid_svg, "toroid": _toroid_svg, "rod": _rod_svg, "gapped": _gapped_svg,
             "multilayer": _bobbin_svg}


def _form_row(p: dict) -> tuple[str, str] | None:
    if p["form"] == "rod":
        core = p["material"] or f"permeability {p['mu_initial']:g}"
        calibrated = (f"; model scaled ×{p['calibration_factor']:.3f} to the test winding"
                      if p["calibration_factor"] is not None else "; model uncalibrated")
        return "rod", f"{core}, apparent permeability {p['rod_permeability']:.1f}{calibrated}"
    if p["form"] == "gapped":
        core = p["material"] or "measured AL"
        gap = f", gap {format_length(p['gap_m'])}" if p["gap_m"] is not None else ""
        return "core", (f"{core}{gap}: AL {format_quantity(p['al_H'], 'H')} per turn²; "
                        f"{p['turns_per_layer']} turns a layer")
    if p["form"] == "multilayer":
        return "bobbin", f"{p['turns_per_layer']} turns a layer, wound {p['style']}"
    return None


def _card_rows(p: dict) -> list[tuple[str, str]]:
    layers = f"{p['layers']} layer" + ("s" if p["layers"] > 1 else "")
    rows = [("wind", f"{p['turns']} turns in {layers} of {p['wire']} wire ({p['wire_reel']})"),
            ("cut", f"{format_length(p['wire_length_m'])} of wire for each coil "
                    f"(leads {format_length(p['lead_m'])} at each end and the margin included)"),
            ("on", p["stock"])]
    form = _form_row(p)
    if form is not None:
        rows.append(form)
    if p["tap_turn"] is not None:
        where = f", in layer {p['tap_layer']}" if p["layers"] > 1 else ""
        rows.append(("tap", f"at turn {p['tap_turn']} of {p['turns']}, counted from the start of the winding{where}"))
    meter = (f"at {format_quantity(p['meter_frequency_Hz'], 'Hz')}" if p["meter_frequency_Hz"]
             else "at a low test frequency")
    rows.append(("meter", f"expect {_henry(p['meter_inductance_H'])} {meter}; accept "
                          f"{_henry(p['accept_low_H'])} to {_henry(p['accept_high_H'])}"))
    rows.append(("target", f"{_henry(p['target_H'])} ±{p['tolerance']:.1%}"))
    if p.get("frequency_Hz"):
        losses = f"R {format_quantity(p['ac_resistance_ohm'], 'ohm', 3)}"
        if p.get("core_loss_resistance_ohm") is not None:
            losses = (f"R {format_quantity(p['ac_resistance_ohm'], 'ohm', 3)} copper + "
                      f"{format_quantity(p['core_loss_resistance_ohm'], 'ohm', 3)} core (typical of "
                      f"{p.get('material')}, rough)")
        rows.append(("at", f"{format_quantity(p['frequency_Hz'], 'Hz')}: L {_henry(p['apparent_inductance_H'])}, "
                           f"{losses}, Q {p['q']:.0f}"))
    if p.get("srf_Hz") and math.isfinite(p["srf_Hz"]):
        rows.append(("self-resonance", f"{format_quantity(p['srf_Hz'], 'Hz', 3)} (self-capacitance "
                                       f"{format_quantity(p['self_capacitance_F'], 'F', 2)}, estimated)"))
    if p.get("flux_density_T") is not None and p.get("saturation_flux_density_T"):
        rows.append(("core", f"{format_quantity(p['flux_density_T'], 'T', 3)} at the coil's current, saturation "
                             f"{format_quantity(p['saturation_flux_density_T'], 'T', 3)}"))
    return rows


def winding_card(name: str, placements: list[dict]) -> str:
    """A self-contained HTML winding card for one coil type (one section per stock item it is wound on)."""
    body = [f"<h1>Winding card: {html.escape(name)}</h1>"]
    for p in placements:
        body.append(f"<h2>{p['quantity']} × on {html.escape(p['stock'])}</h2>")
        body.append(_DRAWINGS[p["form"]](p))
        body.append("<table>" + "".join(f"<tr><td>{html.escape(a)}</td><td>{html.escape(b)}</td></tr>"
                                        for a, b in _card_rows(p)) + "</table>")
        for title, items in (("warnings", p["warnings"]), ("cautions", p["cautions"])):
            if items:
                body.append(f'<p class="c">{title}:</p><ul>' + "".join(f"<li>{html.escape(t)}</li>" for t in items)
                            + "</ul>")
    return ("<!DOCTYPE html>\n<html lang=\"en\"><head><meta charset=\"utf-8\">"
            f"<title>{html.escape(name)}: winding card</title><style>{_STYLE}</style></head><body>"
            + "\n".join(body) + "</body></html>\n")


def card_files(fields: dict) -> dict[str, str]:
    """File name → HTML of each coil type's winding card (names made safe and distinct)."""
    by_coil: dict[str, list[dict]] = {}
    for p in fields["placements"]:
        by_coil.setdefault(p["coil"], []).append(p)
    files: dict[str, str] = {}
    for name, placements in by_coil.items():
        slug = re.sub(r"[^A-Za-z0-9._-]+", "-", name).strip("-.") or "coil"
        file, number = f"card-{slug}.html", 2
        while file in files:
            file, number = f"card-{slug}-{number}.html", number + 1
        files[file] = winding_card(name, placements)
    return files
