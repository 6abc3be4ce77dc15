import type { ClassStanding } from './access';
import type { ClassRecord } from './classes';
import { classCouponRows } from './class-coupons';
import { pendingInvitations } from './invitations';
import { studentsOf } from './roster';

/** A class as the API answers it: managers see addresses and open invitations; students see classmates' names. */
export async function classView(cls: ClassRecord, standing: ClassStanding) {
  const students = await studentsOf(cls.id);
  const coupons = await classCouponRows(cls.id);
  return {
    id: cls.id,
    name: cls.name,
    term: cls.term,
    description: cls.description,
    instructor: { id: cls.instructorId, name: cls.instructorName },
    standing,
    createdAt: cls.createdAt.toISOString(),
    students: students.map((student) => ({
      userId: student.userId,
      name: student.name,
      joinedAt: student.joinedAt.toISOString(),
      shared: student.shared,
      ...(standing === 'manager' ? { email: student.email } : {}),
    })),
    ...(standing === 'manager'
      ? {
          invitations: (await pendingInvitations(cls.id)).map((invitation) => ({
            id: invitation.id,
            email: invitation.email,
            expiresAt: invitation.expiresAt.toISOString(),
            expired: invitation.expired,
          })),
        }
      : {}),
    coupons: coupons.map((coupon) => ({
      id: coupon.id,
      title: coupon.title,
      owner: coupon.ownerName,
      alloys: coupon.layerDetails.map((layer) => layer.alloy),
      process: coupon.process,
      temperatureC: coupon.temperatureC,
      holdSeconds: coupon.holdSeconds,
      swatches: coupon.swatches,
    })),
  };
}
