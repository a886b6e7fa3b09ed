"""Reflectance against angle for a sensor output (docs/results_file.md, kind = sensor): the run's R(theta)
and the repeat with the sensing medium's index raised by delta_n, with a binding material also the
scan before binding (the bound layer replaced by the sensing medium), the dip of each marked
(resonance angle, minimum, and the full width at half depth as a bar at the half level; definitions
in docs/sensor.md), and the figures in the title."""
import math

from plot_common import new_figure, text


def _number(g, name):
    return float(g.attrs.get(name, math.nan))


def sensor_figure(name, g):
    angle = g["angle_deg"][...]
    fig, (ax,) = new_figure(1)
    medium, n, dn = text(g.attrs.get("medium", b"")), _number(g, "index"), _number(g, "delta_n")
    binding = text(g.attrs.get("binding", b""))
    curves = [("", "reflectance", "C0", f"{medium}, n = {n:.4f}" + (f", {binding} bound" if binding else "")),
              ("_raised", "reflectance_raised", "C3", f"{medium} n + {dn:g}")]
    if binding:
        curves.insert(0, ("_before_binding", "reflectance_before_binding", "C2", f"before binding (no {binding})"))
    for suffix, data, colour, label in curves:
        ax.plot(angle, g[data][...], color=colour, lw=1.2, label=label)
        theta, r_min = _number(g, "resonance_angle_deg" + suffix), _number(g, "r_min" + suffix)
        if math.isfinite(theta):
            ax.plot([theta], [r_min], marker="v", color=colour, ms=7, ls="none")
            ax.axvline(theta, color=colour, lw=0.6, ls=":")
        left, right = (list(g.attrs.get("half_depth_angles_deg" + suffix, [math.nan, math.nan])) + [math.nan] * 2)[:2]
        half = 0.5 * (_number(g, "baseline" + suffix) + r_min)
        if math.isfinite(left) and math.isfinite(right):
            ax.plot([left, right], [half, half], color=colour, lw=2.5, alpha=0.5)
    wl = _number(g, "wavelength_nm")
    ax.set_title(f"Sensor {name} at {wl:.1f} nm: dip {_number(g, 'resonance_angle_deg'):.3f} deg, "
                 f"R_min {_number(g, 'r_min'):.3g}, width {_number(g, 'width_deg'):.3f} deg\n"
                 f"sensitivity {_number(g, 'sensitivity_deg_per_riu'):.1f} deg/RIU, "
                 f"figure of merit {_number(g, 'figure_of_merit'):.1f} /RIU"
                 + (f", binding shift {_number(g, 'binding_shift_deg'):+.3f} deg" if binding else ""), fontsize="medium")
    warnings = text(g.attrs.get("warnings", b""))
    if warnings:
        ax.text(0.01, 0.02, "warning: " + warnings, transform=ax.transAxes, fontsize="x-small", color="C3", wrap=True)
    ax.set_xlabel("angle of incidence in the incident medium (deg)")
    ax.set_ylabel("reflectance R")
    ax.set_ylim(0, 1.02)
    ax.grid(True, alpha=0.3)
    ax.legend(fontsize="small", loc="upper right")
    return fig
