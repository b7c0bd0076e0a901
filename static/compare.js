// bondgap compare page: band gap against lattice constant, with the substrate line.
"use strict";

(function () {
  function draw() {
    const node = document.getElementById("compare-data");
    const el = document.getElementById("chart-compare");
    if (!node || !el || !window.Plotly) return;
    const d = JSON.parse(node.textContent);
    const has = function (p) { return p.a !== null && p.gap !== null; };
    const bg = d.background.filter(has);
    const picked = d.candidates.filter(has);
    const yours = d.candidates.filter(function (p) {
      return p.yours_gap !== null && (p.yours_a !== null || p.a !== null);
    });
    const traces = [
      { x: bg.map(function (p) { return p.a; }), y: bg.map(function (p) { return p.gap; }),
        text: bg.map(function (p) { return p.formula; }), mode: "markers", type: "scatter",
        name: "catalogue", marker: { color: "#c5c0b5", size: 6 },
        hovertemplate: "%{text}: a %{x:.4f} Å, Eg %{y:.3f} eV<extra></extra>" },
      { x: picked.map(function (p) { return p.a; }), y: picked.map(function (p) { return p.gap; }),
        text: picked.map(function (p) { return p.formula; }), mode: "markers",
        type: "scatter", name: "candidates",
        marker: { color: "#0e6466", size: 11 },
        hovertemplate: "%{text}: a %{x:.4f} Å, Eg %{y:.3f} eV<extra></extra>" },
    ];
    if (yours.length) {
      traces.push({
        x: yours.map(function (p) { return p.yours_a !== null ? p.yours_a : p.a; }),
        y: yours.map(function (p) { return p.yours_gap; }),
        text: yours.map(function (p) { return p.formula + " (yours)"; }),
        mode: "markers", type: "scatter", name: "yours",
        marker: { symbol: "diamond-open", size: 12, color: "#8a4b0f", line: { width: 2 } },
        hovertemplate: "%{text}: a %{x:.4f} Å, Eg %{y:.3f} eV<extra></extra>" });
    }
    const shapes = [];
    const annotations = [];
    if (d.substrate) {
      shapes.push({ type: "line", xref: "x", yref: "paper", x0: d.substrate.a, x1: d.substrate.a,
                    y0: 0, y1: 1, line: { color: "#1f2733", width: 1.5, dash: "dash" } });
      annotations.push({ x: d.substrate.a, y: 1, xref: "x", yref: "paper", yanchor: "bottom",
                         text: d.substrate.name + " " + d.substrate.a.toFixed(4) + " Å",
                         showarrow: false, font: { size: 11 } });
    }
    // Zoom on the candidates (and the substrate): the catalogue is context, not the subject.
    const xs = picked.map(function (p) { return p.a; })
      .concat(yours.map(function (p) { return p.yours_a !== null ? p.yours_a : p.a; }))
      .concat(d.substrate ? [d.substrate.a] : []);
    const ys = picked.map(function (p) { return p.gap; })
      .concat(yours.map(function (p) { return p.yours_gap; }));
    const span = function (values, pad, floor) {
      if (!values.length) return undefined;
      const lo = Math.min.apply(null, values), hi = Math.max.apply(null, values);
      const margin = Math.max((hi - lo) * 0.25, pad);
      return [floor === undefined ? lo - margin : Math.max(floor, lo - margin), hi + margin];
    };
    const layout = {
      margin: { l: 60, r: 20, t: 30, b: 50 }, paper_bgcolor: "#ffffff", plot_bgcolor: "#ffffff",
      font: { family: "system-ui, sans-serif", size: 12, color: "#1f2733" },
      xaxis: { title: { text: "Lattice constant a (Å)" }, gridcolor: "#eeebe4",
               range: span(xs, 0.15) },
      yaxis: { title: { text: "Band gap (eV)" }, gridcolor: "#eeebe4",
               range: span(ys, 0.4, Math.min(0, Math.min.apply(null, ys.concat([0])))) },
      legend: { orientation: "h", y: -0.2 }, shapes: shapes, annotations: annotations,
    };
    Plotly.newPlot(el, traces, layout, { displaylogo: false, responsive: true }).then(function () {
      // Candidates' labels beside their points, clear of each other and of every marker.
      const yoursAt = function (p) {
        return { x: p.yours_a !== null ? p.yours_a : p.a, y: p.yours_gap, r: 7 };
      };
      const markers = picked.map(function (p) { return { x: p.a, y: p.gap, r: 6 }; })
        .concat(yours.map(yoursAt));
      const grey = bg.map(function (p) { return { x: p.a, y: p.gap, r: 3 }; });
      const labels = picked.map(function (p) {
        return { x: p.a, y: p.gap, text: p.formula, r: 6, colour: "#0e6466" };
      });
      window.bondgapLabels.attach(el, annotations, function (node) {
        return window.bondgapLabels.place(node, labels, { points: markers, soft: grey, size: 12 });
      });
    });
  }
  document.addEventListener("DOMContentLoaded", draw);
})();
