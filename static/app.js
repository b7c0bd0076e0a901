// bondgap pages: filter form conveniences and the two charts of a compound page.
// Sorting and filtering work without JavaScript (links and a GET form); this only adds comfort.
"use strict";

(function () {
  const COLOURS = { fourfold: "#0e6466", sixfold: "#b5651d", other: "#8b93a1" };

  function wireFilters() {
    const form = document.querySelector("form.filters");
    if (!form) return;
    // Apply a select or the checkbox as soon as it changes (not on forms marked data-manual).
    form.querySelectorAll("select, input[type=checkbox]").forEach(function (el) {
      if (form.hasAttribute("data-manual")) return;
      el.addEventListener("change", function () { form.requestSubmit(); });
    });
    // Keep URLs short: leave empty fields out of the query string.
    form.addEventListener("submit", function () {
      form.querySelectorAll("select, input").forEach(function (el) {
        if (el.type !== "checkbox" && el.value === "") el.disabled = true;
      });
    });
  }

  function chartData() {
    const node = document.getElementById("chart-data");
    return node ? JSON.parse(node.textContent) : null;
  }

  const BASE_LAYOUT = {
    margin: { l: 60, r: 20, t: 10, b: 50 },
    paper_bgcolor: "#ffffff",
    plot_bgcolor: "#ffffff",
    font: { family: "system-ui, sans-serif", size: 12, color: "#1f2733" },
    hoverlabel: { bgcolor: "#1f2733", font: { color: "#fff" } },
  };
  const CONFIG = { displaylogo: false, responsive: true };

  function drawLevels(d) {
    const el = document.getElementById("chart-levels");
    if (!el || !d) return;
    const seg = function (x0, x1, y, name, colour) {
      return { x: [x0, x1], y: [y, y], mode: "lines", line: { color: colour, width: 4 },
               name: name, hovertemplate: name + ": %{y:.2f} eV<extra></extra>" };
    };
    const link = function (x0, y0, x1, y1) {
      return { x: [x0, x1], y: [y0, y1], mode: "lines", showlegend: false, hoverinfo: "skip",
               line: { color: "#8b93a1", width: 1, dash: "dot" } };
    };
    const traces = [
      seg(0, 1, d.cation_eV, d.cation + " hybrid", COLOURS.other),
      seg(3, 4, d.anion_eV, d.anion + " hybrid", COLOURS.other),
      seg(1.5, 2.5, d.bonding_eV, "bonding", COLOURS.fourfold),
      seg(1.5, 2.5, d.antibonding_eV, "antibonding", COLOURS.sixfold),
      link(1, d.cation_eV, 1.5, d.bonding_eV), link(1, d.cation_eV, 1.5, d.antibonding_eV),
      link(3, d.anion_eV, 2.5, d.bonding_eV), link(3, d.anion_eV, 2.5, d.antibonding_eV),
    ];
    const label = function (x, y, text) {
      return { x: x, y: y, text: text, showarrow: false, yshift: 12, font: { size: 11 } };
    };
    // Room above the top level for its label, and a top margin for the plot toolbar.
    const levels = [d.cation_eV, d.anion_eV, d.bonding_eV, d.antibonding_eV];
    const lo = Math.min.apply(null, levels), hi = Math.max.apply(null, levels);
    const pad = Math.max(hi - lo, 1) * 0.15;
    const layout = Object.assign({}, BASE_LAYOUT, {
      showlegend: false,
      margin: { l: 60, r: 20, t: 40, b: 20 },
      xaxis: { visible: false, range: [-0.3, 4.3] },
      yaxis: { title: { text: "Energy (eV)" }, zeroline: false, gridcolor: "#eeebe4",
               range: [lo - pad, hi + pad] },
      annotations: [
        label(0.5, d.cation_eV, d.cation + " sp³ " + d.cation_eV.toFixed(2)),
        label(3.5, d.anion_eV, d.anion + " sp³ " + d.anion_eV.toFixed(2)),
        label(2, d.bonding_eV, "bonding " + d.bonding_eV.toFixed(2)),
        label(2, d.antibonding_eV, "antibonding " + d.antibonding_eV.toFixed(2)),
      ],
    });
    Plotly.newPlot(el, traces, layout, CONFIG);
  }

  function drawEhC(d) {
    const el = document.getElementById("chart-ehc");
    if (!el || !d) return;
    const groups = {};
    d.points.forEach(function (p) {
      const key = p.coordination === "fourfold" || p.coordination === "sixfold"
        ? p.coordination : "other";
      (groups[key] = groups[key] || []).push(p);
    });
    const names = { fourfold: "fourfold (observed)", sixfold: "sixfold (observed)",
                    other: "coordination not known" };
    const traces = Object.keys(groups).map(function (key) {
      const pts = groups[key];
      return {
        x: pts.map(function (p) { return p.eh; }), y: pts.map(function (p) { return p.c; }),
        text: pts.map(function (p) { return p.formula; }),
        customdata: pts.map(function (p) { return [p.ionicity, p.route]; }),
        mode: "markers", type: "scatter", name: names[key],
        marker: { color: COLOURS[key], size: 7, opacity: 0.75 },
        hovertemplate: "%{text}<br>Eh %{x:.2f} eV, C %{y:.2f} eV<br>" +
          "fi %{customdata[0]:.3f} (%{customdata[1]})<extra></extra>",
      };
    });
    const xmax = Math.max.apply(null, d.points.map(function (p) { return p.eh; })) * 1.1;
    const ymax = Math.max.apply(null, d.points.map(function (p) { return p.c; })) * 1.15;
    traces.push({ x: [0, xmax], y: [0, xmax * d.critical_slope], mode: "lines",
                  name: "fi = " + d.critical_ionicity,
                  line: { color: "#1f2733", width: 1.5, dash: "dash" }, hoverinfo: "skip" });
    const me = d.points.find(function (p) { return p.formula === d.formula; });
    if (me) {
      traces.push({ x: [me.eh], y: [me.c], mode: "markers", name: me.formula,
                    hoverinfo: "skip", showlegend: false,
                    marker: { size: 15, color: "rgba(0,0,0,0)",
                              line: { color: "#1f2733", width: 2 } } });
    }
    // The legend sits at the foot of the figure, below the axis title, never on it.
    const layout = Object.assign({}, BASE_LAYOUT, {
      xaxis: { title: { text: "Homopolar gap Eh (eV)" }, range: [0, xmax], gridcolor: "#eeebe4" },
      yaxis: { title: { text: "Heteropolar gap C (eV)" }, range: [0, ymax], gridcolor: "#eeebe4" },
      legend: { orientation: "h", yref: "container", y: 0, yanchor: "bottom", x: 0 },
      margin: { l: 60, r: 20, t: 30, b: 110 },
    });
    Plotly.newPlot(el, traces, layout, CONFIG).then(function () {
      if (!me || !window.bondgapLabels) return;
      // The compound's own label: off the data points, with a leader line where needed.
      const points = d.points.map(function (p) { return { x: p.eh, y: p.c, r: 4 }; });
      const label = [{ x: me.eh, y: me.c, text: me.formula, r: 8 }];
      window.bondgapLabels.attach(el, [], function (node) {
        return window.bondgapLabels.place(node, label, { points: points, size: 13 });
      });
    });
  }

  document.addEventListener("DOMContentLoaded", function () {
    wireFilters();
    const data = chartData();
    if (data && window.Plotly) {
      drawLevels(data.levels);
      drawEhC(data.ehc);
    }
  });
})();
