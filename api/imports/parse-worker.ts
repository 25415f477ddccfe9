// Worker thread entry: parses one CSV import per message, off the main event loop.
import { parentPort } from 'node:worker_threads';
import { parseImportCsv, type ImportContext } from '../../shared/import/parse-import';

parentPort?.on('message', (message: { id: number; text: string; context: ImportContext }) => {
  try {
    parentPort!.postMessage({
      id: message.id,
      result: parseImportCsv(message.text, message.context),
    });
  } catch (error) {
    parentPort!.postMessage({ id: message.id, error: (error as Error).message });
  }
});
