"""HTTP routes: `pages` (HTML) and `api` (JSON), both built on `app.queries`."""
