import { stockMetadata, stockPage } from '../_stock/stock-page';

export const metadata = stockMetadata('receive');
export default stockPage('receive');
