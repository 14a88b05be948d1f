import type { RouteModules } from '@/lib/http/openapi';
import * as attachmentsId from '../attachments/[id]/route';
import * as attachments from '../attachments/route';
import * as authNextauth from '../auth/[...nextauth]/route';
import * as benchCheckCompare from '../bench-check/compare/route';
import * as benchCheck from '../bench-check/route';
import * as booksExport from '../books/export/route';
import * as booksSpend from '../books/spend/route';
import * as booksPeriods from '../books/periods/route';
import * as booksReconciliation from '../books/reconciliation/route';
import * as booksResolutions from '../books/resolutions/route';
import * as booksSweep from '../books/sweep/route';
import * as calendarToken from '../calendar/[token]/route';
import * as calendarLink from '../calendar/link/route';
import * as holdsId from '../holds/[id]/route';
import * as holds from '../holds/route';
import * as invitationsId from '../invitations/[id]/route';
import * as invitationsAccept from '../invitations/accept/route';
import * as invitations from '../invitations/route';
import * as kitsBoxesIdRefill from '../kits/boxes/[id]/refill/route';
import * as kitsBoxesId from '../kits/boxes/[id]/route';
import * as kitsBoxes from '../kits/boxes/route';
import * as kitsTemplatesId from '../kits/templates/[id]/route';
import * as kitsTemplates from '../kits/templates/route';
import * as labels from '../labels/route';
import * as loansIdRenew from '../loans/[id]/renew/route';
import * as loansIdReturn from '../loans/[id]/return/route';
import * as loansId from '../loans/[id]/route';
import * as loansPreview from '../loans/preview/route';
import * as loans from '../loans/route';
import * as locationsId from '../locations/[id]/route';
import * as locations from '../locations/route';
import * as openapiJson from '../openapi.json/route';
import * as partsId from '../parts/[id]/route';
import * as partsIdUnits from '../parts/[id]/units/route';
import * as partsExport from '../parts/export/route';
import * as partsImport from '../parts/import/route';
import * as parts from '../parts/route';
import * as paymentsWebhook from '../payments/webhook/route';
import * as peopleId from '../people/[id]/route';
import * as people from '../people/route';
import * as reminders from '../reminders/route';
import * as salesIdCancel from '../sales/[id]/cancel/route';
import * as salesIdRefunds from '../sales/[id]/refunds/route';
import * as salesId from '../sales/[id]/route';
import * as salesIdSettle from '../sales/[id]/settle/route';
import * as salesCash from '../sales/cash/route';
import * as salesHonourBox from '../sales/honour-box/route';
import * as honourBox from '../honour-box/route';
import * as honourBoxCounts from '../honour-box/counts/route';
import * as honourBoxBankings from '../honour-box/bankings/route';
import * as salesCatalog from '../sales/catalog/route';
import * as sales from '../sales/route';
import * as scanCode from '../scan/[code]/route';
import * as scan from '../scan/route';
import * as settings from '../settings/route';
import * as signInLink from '../sign-in-link/route';
import * as stockAdjust from '../stock/adjust/route';
import * as stockCountsIdPost from '../stock/counts/[id]/post/route';
import * as stockCountsId from '../stock/counts/[id]/route';
import * as stockCounts from '../stock/counts/route';
import * as stockMove from '../stock/move/route';
import * as stockReceive from '../stock/receive/route';
import * as stockRepairs from '../stock/repairs/route';
import * as stockUnitsId from '../stock/units/[id]/route';
// Running it for a space (issue 15): first run, health.
import * as firstRun from '../first-run/route';
import * as health from '../health/route';
import * as exportSpace from '../export/route';
import * as peopleIdErase from '../people/[id]/erase/route';
// Steward: box upkeep (issue 12)
import * as kitsBoxesIdContents from '../kits/boxes/[id]/contents/route';
import * as kitsBoxesIdTakeApart from '../kits/boxes/[id]/take-apart/route';

// Every route file of the production build, by its path in the API document. A test compares this list
// with app/api on disk (and the test, bench and dev doors, which are not in the production build, are
// left out on purpose), so a route cannot exist without being declared and documented.
// Borrowing rules (issue 16): standing, inductions, opening calendar, presence.
import * as settingsBorrowing from '../settings/borrowing/route';
import * as settingsMoney from '../settings/money/route';
import * as inductions from '../inductions/route';
import * as inductionsId from '../inductions/[id]/route';
import * as inductionsIdSignoffs from '../inductions/[id]/signoffs/route';
import * as signoffs from '../signoffs/route';
import * as signoffsId from '../signoffs/[id]/route';
import * as loansIdHandOver from '../loans/[id]/hand-over/route';
import * as loansIdCancel from '../loans/[id]/cancel/route';
import * as peopleIdSettleCharges from '../people/[id]/settle-charges/route';
import * as peopleIdPayCharges from '../people/[id]/pay-charges/route';
import * as loansIdDepositRelease from '../loans/[id]/deposit-release/route';
// Restocking (issue 13): suppliers, offers, what to order, order lists, the budget.
import * as suppliers from '../suppliers/route';
import * as suppliersId from '../suppliers/[id]/route';
import * as suppliersOffers from '../suppliers/offers/route';
import * as suppliersOffersId from '../suppliers/offers/[id]/route';
import * as suppliersOffersExport from '../suppliers/offers/export/route';
import * as suppliersOffersImport from '../suppliers/offers/import/route';
import * as orders from '../orders/route';
import * as ordersToOrder from '../orders/to-order/route';
import * as ordersId from '../orders/[id]/route';
import * as ordersIdSend from '../orders/[id]/send/route';
import * as ordersIdReceive from '../orders/[id]/receive/route';
import * as ordersIdCancel from '../orders/[id]/cancel/route';
import * as ordersIdApprove from '../orders/[id]/approve/route';
import * as ordersIdPdf from '../orders/[id]/pdf/route';
import * as settingsRestocking from '../settings/restocking/route';

export const ROUTES: RouteModules = {
  '/api/attachments/{id}': attachmentsId,
  '/api/attachments': attachments,
  '/api/auth/{nextauth}': authNextauth,
  '/api/bench-check/compare': benchCheckCompare,
  '/api/bench-check': benchCheck,
  '/api/books/export': booksExport,
  '/api/books/periods': booksPeriods,
  '/api/books/reconciliation': booksReconciliation,
  // Books (treasurer): notes that explain rows that do not match
  '/api/books/resolutions': booksResolutions,
  // Books: the restocking spend as CSV (treasurers and admins)
  '/api/books/spend': booksSpend,
  '/api/books/sweep': booksSweep,
  '/api/calendar/{token}': calendarToken,
  '/api/calendar/link': calendarLink,
  '/api/holds/{id}': holdsId,
  '/api/holds': holds,
  '/api/invitations/{id}': invitationsId,
  '/api/invitations/accept': invitationsAccept,
  '/api/invitations': invitations,
  '/api/kits/boxes/{id}/refill': kitsBoxesIdRefill,
  '/api/kits/boxes/{id}': kitsBoxesId,
  '/api/kits/boxes': kitsBoxes,
  '/api/kits/templates/{id}': kitsTemplatesId,
  '/api/kits/templates': kitsTemplates,
  '/api/labels': labels,
  '/api/loans/{id}/renew': loansIdRenew,
  '/api/loans/{id}/return': loansIdReturn,
  '/api/loans/{id}': loansId,
  '/api/loans/preview': loansPreview,
  '/api/loans': loans,
  '/api/locations/{id}': locationsId,
  '/api/locations': locations,
  '/api/openapi.json': openapiJson,
  '/api/parts/{id}': partsId,
  '/api/parts/{id}/units': partsIdUnits,
  '/api/parts/export': partsExport,
  '/api/parts/import': partsImport,
  '/api/parts': parts,
  '/api/payments/webhook': paymentsWebhook,
  '/api/people/{id}': peopleId,
  '/api/people': people,
  '/api/reminders': reminders,
  '/api/sales/{id}/cancel': salesIdCancel,
  '/api/sales/{id}/refunds': salesIdRefunds,
  '/api/sales/{id}': salesId,
  '/api/sales/{id}/settle': salesIdSettle,
  '/api/sales/cash': salesCash,
  '/api/sales/honour-box': salesHonourBox,
  '/api/honour-box': honourBox,
  '/api/honour-box/counts': honourBoxCounts,
  '/api/honour-box/bankings': honourBoxBankings,
  '/api/sales/catalog': salesCatalog,
  '/api/sales': sales,
  '/api/scan/{code}': scanCode,
  '/api/scan': scan,
  '/api/settings': settings,
  '/api/sign-in-link': signInLink,
  '/api/stock/adjust': stockAdjust,
  '/api/stock/counts/{id}/post': stockCountsIdPost,
  '/api/stock/counts/{id}': stockCountsId,
  '/api/stock/counts': stockCounts,
  '/api/stock/move': stockMove,
  '/api/stock/receive': stockReceive,
  '/api/stock/repairs': stockRepairs,
  '/api/stock/units/{id}': stockUnitsId,
  // Running it for a space (issue 15)
  '/api/first-run': firstRun,
  '/api/health': health,
  '/api/export': exportSpace,
  '/api/people/{id}/erase': peopleIdErase,
  // Steward: box upkeep (issue 12)
  '/api/kits/boxes/{id}/contents': kitsBoxesIdContents,
  '/api/kits/boxes/{id}/take-apart': kitsBoxesIdTakeApart,
  // Borrowing rules (issue 16)
  '/api/settings/borrowing': settingsBorrowing,
  '/api/settings/money': settingsMoney,
  '/api/inductions': inductions,
  '/api/inductions/{id}': inductionsId,
  '/api/inductions/{id}/signoffs': inductionsIdSignoffs,
  '/api/signoffs': signoffs,
  '/api/signoffs/{id}': signoffsId,
  '/api/loans/{id}/hand-over': loansIdHandOver,
  '/api/loans/{id}/cancel': loansIdCancel,
  '/api/people/{id}/settle-charges': peopleIdSettleCharges,
  '/api/people/{id}/pay-charges': peopleIdPayCharges,
  '/api/loans/{id}/deposit-release': loansIdDepositRelease,
  // Restocking (issue 13)
  '/api/suppliers': suppliers,
  '/api/suppliers/{id}': suppliersId,
  '/api/suppliers/offers': suppliersOffers,
  '/api/suppliers/offers/{id}': suppliersOffersId,
  '/api/suppliers/offers/export': suppliersOffersExport,
  '/api/suppliers/offers/import': suppliersOffersImport,
  '/api/orders': orders,
  '/api/orders/to-order': ordersToOrder,
  '/api/orders/{id}': ordersId,
  '/api/orders/{id}/send': ordersIdSend,
  '/api/orders/{id}/receive': ordersIdReceive,
  '/api/orders/{id}/cancel': ordersIdCancel,
  '/api/orders/{id}/approve': ordersIdApprove,
  '/api/orders/{id}/pdf': ordersIdPdf,
  '/api/settings/restocking': settingsRestocking,
};
