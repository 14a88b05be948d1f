import { stockMetadata, stockPage } from '../_stock/stock-page';

export const metadata = stockMetadata('move');
export default stockPage('move');
