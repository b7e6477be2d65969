export { SizingCalculatorPage as Component } from '@/features/sizing/components/sizing-calculator-page';
