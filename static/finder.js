// bondgap alloy chart: band gap against lattice constant (the finder and a composition's page).
// Binaries as labelled points, each system as a curve or an outlined region, the substrate as
// a vertical line, the target as a band, the highlighted compositions on top.
"use strict";

(function () {
  const INK = "#1f2733";
  const ACCENT = "#0e6466";
  const WARM = "#b5651d";
  const PALETTE = ["#0e6466", "#7a4f9a", "#b5651d", "#2f6fb0", "#8a7a12", "#a23b5b",
                   "#3b8f4f", "#5d6675", "#c0692f", "#1f8a8a"];
  const CONFIG = { displaylogo: false, responsive: true };

  function jsonOf(id) {
    const node = document.getElementById(id);
    return node ? JSON.parse(node.textContent) : null;
  }

  function finite(values) {
    return values.filter(function (v) { return v !== null && isFinite(v); });
  }

  function systemTrace(s, i) {
    const colour = PALETTE[i % PALETTE.length];
    const region = s.form === "quaternary";
    return {
      x: s.a, y: s.gap, mode: "lines", type: "scatter", name: s.name,
      line: { color: colour, width: region ? 1.2 : 2.2 },
      fill: region ? "toself" : "none", fillcolor: colour + "22",
      hovertemplate: s.name + "<br>a %{x:.4f} Å<br>Eg %{y:.3f} eV<extra></extra>",
    };
  }

  // A range around `values` with room on both sides (a share of their span, at least `least`).
  function padded(values, share, least) {
    const lo = Math.min.apply(null, values), hi = Math.max.apply(null, values);
    const pad = Math.max((hi - lo) * share, least);
    return [lo - pad, hi + pad];
  }

  function draw(d) {
    const el = document.getElementById("chart-plane");
    if (!el || !d || !window.Plotly) return;
    const m = d.matches;
    const traces = [];
    if (m.formula.length) {  // under the curves: the curve stays readable through them
      traces.push({
        x: m.a, y: m.gap, text: m.formula, customdata: m.mismatch,
        name: m.formula.length === 1 ? m.formula[0] : "matches (" + m.formula.length +
          (d.matches_in_table > m.formula.length ? " of " + d.matches_in_table : "") + ")",
        mode: "markers", type: "scatter",
        marker: { color: WARM, size: 7, symbol: "diamond", opacity: 0.75,
                  line: { color: INK, width: 0.5 } },
        hovertemplate: "%{text}<br>a %{x:.4f} Å, f %{customdata:.2e}<br>" +
          "Eg %{y:.3f} eV<extra></extra>",
      });
    }
    Array.prototype.push.apply(traces, d.systems.map(systemTrace));
    traces.push({
      x: d.binaries.a, y: d.binaries.gap, text: d.binaries.formula, name: "binaries",
      mode: "markers", type: "scatter", marker: { color: INK, size: 6 },
      hovertemplate: "%{text}<br>a %{x:.4f} Å<br>Eg %{y:.3f} eV<extra></extra>",
    });
    // Frame the systems, the matches and the substrate; binaries further out stay on the
    // chart (double-click autoscales to show them all).
    const xs = finite(m.a);
    const ys = finite(m.gap);
    d.systems.forEach(function (s) {
      Array.prototype.push.apply(xs, finite(s.a));
      Array.prototype.push.apply(ys, finite(s.gap));
    });
    if (!xs.length) {
      Array.prototype.push.apply(xs, finite(d.binaries.a));
      Array.prototype.push.apply(ys, finite(d.binaries.gap));
    }
    const shapes = [];
    const annotations = [];
    if (d.substrate) {
      xs.push(d.substrate.a);
      shapes.push({ type: "line", xref: "x", yref: "paper", x0: d.substrate.a,
                    x1: d.substrate.a, y0: 0, y1: 1,
                    line: { color: ACCENT, width: 2, dash: "dash" } });
      annotations.push({ x: d.substrate.a, y: 1, xref: "x", yref: "paper", yanchor: "bottom",
                         showarrow: false, font: { size: 11, color: ACCENT },
                         text: d.substrate.name + " " + d.substrate.a.toFixed(4) + " Å" });
    }
    if (d.target) {
      const high = d.target.high === null ? Math.max.apply(null, ys) + 1 : d.target.high;
      ys.push(d.target.low, Math.min(high, d.target.target + 1));
      shapes.push({ type: "rect", xref: "paper", yref: "y", x0: 0, x1: 1, y0: d.target.low,
                    y1: high, fillcolor: "rgba(181,101,29,0.16)", line: { width: 0 },
                    layer: "below" });
    }
    // Ranges from the data: 12 % of the span on each side (room for the end points' labels),
    // at least 0.002 Å and 0.1 eV, so a narrow system such as AlGaAs is not a vertical line.
    const yRange = padded(ys, 0.12, 0.1);
    const layout = {
      margin: { l: 60, r: 20, t: 24, b: 50 }, paper_bgcolor: "#ffffff", plot_bgcolor: "#ffffff",
      font: { family: "system-ui, sans-serif", size: 12, color: INK },
      hoverlabel: { bgcolor: INK, font: { color: "#fff" } },
      shapes: shapes, annotations: annotations,
      legend: { orientation: "v", y: 0.88, yanchor: "top" },  // below the plot toolbar
      xaxis: { title: { text: "Lattice constant a (Å)" }, gridcolor: "#eeebe4", zeroline: false,
               range: padded(xs, 0.12, 0.002) },
      yaxis: { title: { text: "Band gap at " + d.temperature_K + " K (eV)" },
               gridcolor: "#eeebe4", zeroline: false,
               range: [Math.max(yRange[0], Math.min(0, Math.min.apply(null, ys))), yRange[1]] },
    };
    if (d.target) {  // a legend entry, not a text on the plot: the caption says the rest
      traces.push({ x: layout.xaxis.range, y: [d.target.target, d.target.target], mode: "lines",
                    name: "target " + d.target.target.toFixed(3) + " eV", hoverinfo: "skip",
                    line: { color: WARM, width: 1.2, dash: "dot" } });
    }
    Plotly.newPlot(el, traces, layout, CONFIG).then(function () {
      // The binaries' labels, clear of each other, the markers and (rather) the curves.
      const at = function (xsOf, ysOf, r, texts) {
        return xsOf.map(function (x, i) {
          return { x: x, y: ysOf[i], r: r, text: texts ? texts[i] : "" };
        }).filter(function (p) { return p.x !== null && p.y !== null; });
      };
      const binaries = at(d.binaries.a, d.binaries.gap, 4, d.binaries.formula);
      let curves = at(m.a, m.gap, 4);
      d.systems.forEach(function (s) { curves = curves.concat(at(s.a, s.gap, 2)); });
      window.bondgapLabels.attach(el, annotations, function (node) {
        return window.bondgapLabels.place(node, binaries, { points: binaries, soft: curves,
                                                          size: 11 });
      });
    });
  }

  document.addEventListener("DOMContentLoaded", function () { draw(jsonOf("plane-data")); });
})();
