// The ceiling `bench:ingest` compares ingest with: Express 5 parsing a JSON POST and answering 202,
// with no token, validation or database. Started by the bench in its own process, like the app.
import express from 'express';

const app = express();
app.get('/api/health', (_req, res) => {
  res.json({ ok: true });
});
app.post('/api/v1/heartbeats', express.json({ limit: '64kb' }), (req, res) => {
  const body = req.body as { reports?: unknown[] };
  res.status(202).json({ accepted: Array.isArray(body?.reports) ? body.reports.length : 1, duplicates: 0 });
});
const port = Number(process.env.PORT ?? 0);
app.listen(port, process.env.HOST ?? '127.0.0.1');
