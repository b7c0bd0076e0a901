// bondgap band-gap charts: the band structure of a compound page and the model-accuracy scatter.
"use strict";

(function () {
  const INK = "#1f2733";
  const VALENCE = "#0e6466";
  const CONDUCTION = "#b5651d";
  const PAPER = "rgba(255,255,255,0.85)";
  const FAMILY_COLOURS = { "IV-IV": "#1f2733", "III-V": "#0e6466", "II-VI": "#b5651d",
                           "I-VII": "#7a4f9a" };
  const BASE_LAYOUT = {
    margin: { l: 64, r: 20, t: 10, b: 50 },
    paper_bgcolor: "#ffffff",
    plot_bgcolor: "#ffffff",
    font: { family: "system-ui, sans-serif", size: 12, color: INK },
    hoverlabel: { bgcolor: INK, font: { color: "#fff" } },
  };
  const CONFIG = { displaylogo: false, responsive: true };

  function jsonOf(id) {
    const node = document.getElementById(id);
    return node ? JSON.parse(node.textContent) : null;
  }

  function fmt(value, digits) { return Number(value).toFixed(digits); }

  function shownGapText(g) {
    const what = g.source === "measured" ? "measured" : "estimate";
    let text = what + " gap at " + g.temperature_K + " K: " + fmt(g.value_eV, 3);
    if (g.uncertainty_eV !== null) text += " ± " + fmt(g.uncertainty_eV, 2);
    text += " eV";
    if (g.wavelength_nm) text += " (" + fmt(g.wavelength_nm, 0) + " nm)";
    return text;
  }

  function drawBands(d) {
    const el = document.getElementById("chart-bands");
    if (!el || !d) return;
    const xmax = d.distance[d.distance.length - 1];
    const traces = d.bands.map(function (energies, i) {
      const valence = i < 4;
      return {
        x: d.distance, y: energies, mode: "lines", type: "scatter",
        name: valence ? "valence bands" : "conduction bands",
        legendgroup: valence ? "v" : "c", showlegend: i === 0 || i === 4,
        line: { color: valence ? VALENCE : CONDUCTION, width: 1.8 },
        hovertemplate: "band " + (i + 1) + ": %{y:.2f} eV<extra></extra>",
      };
    });
    traces.push({
      x: [d.valence_top.distance, d.conduction_bottom.distance],
      y: [0, d.conduction_bottom.energy_eV], mode: "markers", name: "band edges",
      marker: { color: INK, size: 8, symbol: "diamond" }, hoverinfo: "skip", showlegend: false,
    });
    const shapes = d.labels.map(function (l) {
      return { type: "line", xref: "x", yref: "paper", x0: l.distance, x1: l.distance,
               y0: 0, y1: 1, line: { color: "#c5c0b5", width: 1 } };
    });
    const annotations = [];
    if (d.model_gap_eV > 0) {
      shapes.push({ type: "rect", xref: "x", yref: "y", x0: 0, x1: xmax, y0: 0,
                    y1: d.model_gap_eV, fillcolor: "rgba(14,100,102,0.10)", line: { width: 0 },
                    layer: "below" });
      annotations.push({ x: xmax * 0.02, y: d.model_gap_eV / 2, xanchor: "left",
                         showarrow: false, font: { size: 11, color: VALENCE }, bgcolor: PAPER,
                         text: "sp³ model gap " + fmt(d.model_gap_eV, 2) + " eV (" +
                           (d.direct ? "direct" : "indirect") + ")" });
    } else {
      annotations.push({ x: xmax * 0.02, y: 0.3, xanchor: "left", showarrow: false,
                         text: "bands overlap in the sp³ model", font: { size: 11 } });
    }
    const g = d.shown_gap;
    if (g && g.value_eV !== null) {
      if (g.uncertainty_eV !== null) {
        shapes.push({ type: "rect", xref: "x", yref: "y", x0: 0, x1: xmax,
                      y0: g.value_eV - g.uncertainty_eV, y1: g.value_eV + g.uncertainty_eV,
                      fillcolor: "rgba(181,101,29,0.10)", line: { width: 0 }, layer: "below" });
      }
      shapes.push({ type: "line", xref: "x", yref: "y", x0: 0, x1: xmax, y0: g.value_eV,
                    y1: g.value_eV, line: { color: CONDUCTION, width: 1.5, dash: "dash" } });
      annotations.push({ x: xmax * 0.98, y: g.value_eV, xanchor: "right", yanchor: "bottom",
                         showarrow: false, font: { size: 11, color: CONDUCTION }, bgcolor: PAPER,
                         text: shownGapText(g) });
    }
    const layout = Object.assign({}, BASE_LAYOUT, {
      shapes: shapes, annotations: annotations,
      legend: { orientation: "h", y: -0.12 },
      margin: { l: 64, r: 20, t: 10, b: 70 },
      xaxis: { range: [0, xmax], showgrid: false, zeroline: false,
               tickmode: "array", tickvals: d.labels.map(function (l) { return l.distance; }),
               ticktext: d.labels.map(function (l) { return l.label; }) },
      yaxis: { title: { text: "Energy relative to the valence-band top (eV)" },
               zeroline: true, zerolinecolor: "#8b93a1", gridcolor: "#eeebe4" },
    });
    Plotly.newPlot(el, traces, layout, CONFIG);
  }

  function drawAccuracy(d) {
    const el = document.getElementById("chart-accuracy");
    if (!el || !d) return;
    const families = [];  // in the rows' order (the JSON object's keys come sorted)
    d.rows.forEach(function (r) { if (families.indexOf(r.family) < 0) families.push(r.family); });
    const traces = families.map(function (family) {
      const rows = d.rows.filter(function (r) { return r.family === family; });
      return {
        x: rows.map(function (r) { return r.measured_eV; }),
        y: rows.map(function (r) { return r.loo_eV; }),
        error_y: { type: "data", array: rows.map(function (r) { return r.uncertainty_eV; }),
                   thickness: 1, width: 0, color: FAMILY_COLOURS[family] || INK },
        text: rows.map(function (r) { return r.formula; }),
        customdata: rows.map(function (r) { return [r.uncertainty_eV, r.error_eV]; }),
        mode: "markers", type: "scatter", name: family,
        marker: { color: FAMILY_COLOURS[family] || INK, size: 8, opacity: 0.85 },
        hovertemplate: "%{text}<br>measured %{x:.2f} eV<br>estimate %{y:.2f} ± " +
          "%{customdata[0]:.2f} eV<br>error %{customdata[1]:+.2f} eV<extra></extra>",
      };
    });
    const all = d.rows.map(function (r) { return r.measured_eV; })
      .concat(d.rows.map(function (r) { return r.loo_eV; }));
    const lo = Math.min(0, Math.min.apply(null, all)) - 0.5;
    const hi = Math.max.apply(null, all) + 1;
    traces.push({ x: [lo, hi], y: [lo, hi], mode: "lines", name: "y = x",
                  line: { color: INK, width: 1.2, dash: "dash" }, hoverinfo: "skip" });
    const layout = Object.assign({}, BASE_LAYOUT, {
      xaxis: { title: { text: "Measured band gap at 300 K (eV)" }, range: [lo, hi],
               gridcolor: "#eeebe4" },
      yaxis: { title: { text: "Leave-one-out estimate (eV)" }, range: [lo, hi],
               gridcolor: "#eeebe4" },
      legend: { orientation: "h", y: -0.2 },
      margin: { l: 64, r: 20, t: 10, b: 80 },
    });
    Plotly.newPlot(el, traces, layout, CONFIG);
  }

  function drawCalibration(d) {
    const el = document.getElementById("chart-calibration");
    if (!el || !d) return;
    const sd = d.rows.map(function (r) { return r.uncertainty_eV; });
    const err = d.rows.map(function (r) { return Math.abs(r.error_eV); });
    const hi = Math.max(Math.max.apply(null, sd) * 1.1, 0.1);
    const top = Math.max(Math.max.apply(null, err), 2 * hi) * 1.05;
    const traces = [
      { x: sd, y: err, text: d.rows.map(function (r) { return r.formula; }),
        mode: "markers", type: "scatter", name: "compound",
        marker: { color: INK, size: 7, opacity: 0.8 },
        hovertemplate: "%{text}<br>stated ± %{x:.2f} eV<br>actual error %{y:.2f} eV<extra></extra>" },
      { x: [0, hi], y: [0, hi], mode: "lines", name: "error = 1 × uncertainty",
        line: { color: INK, width: 1.2 }, hoverinfo: "skip" },
      { x: [0, hi], y: [0, 2 * hi], mode: "lines", name: "error = 2 × uncertainty",
        line: { color: INK, width: 1.2, dash: "dash" }, hoverinfo: "skip" },
    ];
    const layout = Object.assign({}, BASE_LAYOUT, {
      xaxis: { title: { text: "Stated uncertainty (eV)" }, range: [0, hi], gridcolor: "#eeebe4" },
      yaxis: { title: { text: "Actual |error| (eV)" }, range: [0, top], gridcolor: "#eeebe4" },
      legend: { orientation: "h", y: -0.2 },
      margin: { l: 64, r: 20, t: 10, b: 80 },
    });
    Plotly.newPlot(el, traces, layout, CONFIG);
  }

  function wireTemperature() {
    const form = document.getElementById("temperature-form");
    if (!form) return;
    const input = form.querySelector("input[name=temperature]");
    input.addEventListener("change", function () {
      if (input.checkValidity()) form.requestSubmit();
    });
  }

  document.addEventListener("DOMContentLoaded", function () {
    wireTemperature();
    if (!window.Plotly) return;
    const charts = jsonOf("chart-data");
    if (charts) drawBands(charts.bands);
    drawAccuracy(jsonOf("accuracy-data"));
    drawCalibration(jsonOf("accuracy-data"));
  });
})();
