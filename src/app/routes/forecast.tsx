import type { LoaderFunctionArgs } from 'react-router-dom';
import { forecastQueryOptions } from '@/features/forecast/api/forecast';
import { parseForecastParams } from '@/features/forecast/api/forecast-params';
import { queryClient } from './prime';

// The page (and recharts with it) loads only behind this route.
export { ForecastPage as Component } from '@/features/forecast/components/forecast-page';

export function loader({ request }: LoaderFunctionArgs) {
  void queryClient.prefetchQuery(forecastQueryOptions(parseForecastParams(new URL(request.url).searchParams)));
  return null;
}
