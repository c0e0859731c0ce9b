import { AppProvider } from './provider';
import { AppRouter } from './router';

/** The whole client. */
export function App() {
  return (
    <AppProvider>
      <AppRouter />
    </AppProvider>
  );
}
